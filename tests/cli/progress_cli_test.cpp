// Every long command draws the one progress bar (core/progress.h), so each
// honours TWINPROBE_PROGRESS_DELAY_MS; before, render drew its own bar at once
// and could not be told to wait.
#include <catch2/catch.hpp>
#include <cstdlib>

#include "testing/testing.h"

using namespace twinprobe;

namespace {

// Runs `command` on a pseudo-terminal (`script`), so stderr is a TTY there;
// returns everything the terminal received.
std::string OnTerminal(const testing::TempDir& dir, const std::string& command) {
  std::string out = dir / "tty.txt";
  int rc = std::system(("script -qec \"" + command + "\" /dev/null > '" + out + "' 2>&1").c_str());
  CHECK(rc == 0);
  return testing::ReadFile(out);
}

}  // namespace

TEST_CASE("cli render: the bar is the core one and waits for TWINPROBE_PROGRESS_DELAY_MS", "[pty]") {
  testing::TempDir dir;
  REQUIRE(testing::RunCli({"demo", "--out", dir / "demo"}).exit_code == 0);
  const std::string render = "'" + testing::BinaryPath() + "' --study '" + dir / "demo" + "' render --out '";
  std::string now = OnTerminal(dir, "TWINPROBE_PROGRESS_DELAY_MS=0 " + render + dir / "m1" + "'");
  CHECK(now.find("\rrendering [------------------------]   0%  1 of 800") != std::string::npos);
  CHECK(now.find("\rrendering [########################] 100%  800 of 800\r\n") != std::string::npos);
  // A delay longer than the work: the bar never draws.
  std::string later = OnTerminal(dir, "TWINPROBE_PROGRESS_DELAY_MS=600000 " + render + dir / "m2" + "'");
  CHECK(later.find("rendering [") == std::string::npos);
  CHECK(later.find("Rendered 800 probes") != std::string::npos);
}
