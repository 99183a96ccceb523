// Concurrency (issue 12): four processes recording and importing into one
// study at once lose nothing and show no busy error to the user.
#include <catch2/catch.hpp>

#include <cstdlib>
#include <thread>

#include "core/audit.h"
#include "core/store.h"
#include "testing/pinned_clock.h"
#include "testing/testing.h"

using namespace twinprobe;

namespace {

std::string Quote(const std::string& s) { return "'" + s + "'"; }

}  // namespace

TEST_CASE("concurrency: two recording loops and two imports at once all land") {
  testing::PinnedClock clock;  // the season's end: fieldwork times may not lie in the future
  testing::TempDir dir;
  std::string study = dir / "s";
  REQUIRE(testing::RunCli({"--study", study, "init"}).exit_code == 0);
  REQUIRE(testing::RunCli({"--study", study, "plan"}).exit_code == 0);

  auto import_file = [&](const std::string& name, int first, int last) {
    std::string csv = "probe,code,received_at\n";
    for (int i = first; i <= last; ++i) {
      char line[64];
      std::snprintf(line, sizeof line, "P%05d,rejection,2027-04-02T09:00\n", i);
      csv += line;
    }
    testing::WriteFile(dir / name, csv);
    return dir / name;
  };
  std::string f1 = import_file("one.csv", 401, 600), f2 = import_file("two.csv", 601, 800);

  // A recording loop: `twinprobe record` once per probe, as a fieldworker would.
  auto loop = [&](int first, int last, const std::string& log) {
    return "for i in $(seq " + std::to_string(first) + " " + std::to_string(last) + "); do " +
           Quote(testing::BinaryPath()) + " --study " + Quote(study) +
           " record $(printf 'P%05d' $i) invitation --at 2027-04-01T10:00 >/dev/null || echo FAIL $i; done 2>" +
           Quote(log);
  };
  std::vector<std::string> commands = {
      loop(1, 200, dir / "a.err"),
      loop(201, 400, dir / "b.err"),
      Quote(testing::BinaryPath()) + " --study " + Quote(study) + " import outcomes " + Quote(f1) + " >/dev/null 2>" +
          Quote(dir / "c.err"),
      Quote(testing::BinaryPath()) + " --study " + Quote(study) + " import outcomes " + Quote(f2) + " >/dev/null 2>" +
          Quote(dir / "d.err"),
  };
  std::vector<std::thread> workers;
  std::vector<int> codes(commands.size(), -1);
  for (size_t k = 0; k < commands.size(); ++k)
    workers.emplace_back([&, k] { codes[k] = std::system(("bash -c " + Quote(commands[k])).c_str()); });
  for (auto& w : workers) w.join();

  for (size_t k = 0; k < commands.size(); ++k) CHECK(codes[k] == 0);
  for (const char* log : {"a.err", "b.err", "c.err", "d.err"}) {
    INFO(log);
    // No busy error and no failure shown to the user (the recording loops may
    // warn that a probe has no sending recorded: that is expected here).
    std::string err = testing::ReadFile(dir / log);
    CHECK(err.find("FAIL") == std::string::npos);
    CHECK(err.find("busy") == std::string::npos);
    CHECK(err.find("locked") == std::string::npos);
    CHECK(err.find("error") == std::string::npos);
  }
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  CHECK(store.value()->QueryInt("SELECT count(*) FROM response") == 800);
  CHECK(store.value()->QueryInt("SELECT count(DISTINCT probe_id) FROM response") == 800);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM audit") == 1 + 400 + 2);
  CHECK(VerifyAudit(*store.value()).ok());
}
