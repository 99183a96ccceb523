// `twinprobe desk` through the real binary: where it listens, what it
// refuses, and a clean stop on SIGTERM.
#include <fcntl.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <chrono>
#include <regex>
#include <thread>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

void AddTeam(const testing::PlannedStudy& s) {
  testing::WriteFile(s.path + "/study.toml",
                     testing::ReadFile(s.path + "/study.toml") + "\n[team]\nmembers = [\"Ada Moss\"]\n");
}

}  // namespace

TEST_CASE("desk cli: another address than 127.0.0.1 needs TLS, and a design without [team] is refused") {
  testing::PlannedStudy s;
  auto no_team = RunCli({"--study", s.path, "desk", "--port", "0"});
  CHECK(no_team.exit_code == 1);
  CHECK(no_team.err == "twinprobe: " + s.path +
                           "/study.toml: the design names no field team \u2014 add a section [team] with members = "
                           "[\"…\", \"…\"]: the people who may sign in to the desk\n");
  AddTeam(s);
  auto open = RunCli({"--study", s.path, "desk", "--bind", "0.0.0.0"});
  CHECK(open.exit_code == 2);
  CHECK(open.err ==
        "twinprobe: --bind 0.0.0.0: the desk serves another address than 127.0.0.1 only over TLS \u2014 "
        "add --tls-cert FILE --tls-key FILE, or leave out --bind to serve this machine only\n");
  auto half = RunCli({"--study", s.path, "desk", "--tls-cert", "cert.pem"});
  CHECK(half.exit_code == 2);
  CHECK(half.err ==
        "twinprobe: --tls-cert and --tls-key go together \u2014 give both (PEM files), or neither to serve "
        "plain HTTP on 127.0.0.1\n");
}

TEST_CASE("desk cli: prints its loopback address and stops cleanly on SIGTERM") {
  testing::PlannedStudy s;
  AddTeam(s);
  const std::string out_path = s.dir / "desk.out";
  pid_t pid = fork();
  REQUIRE(pid >= 0);
  if (pid == 0) {
    int out = open(out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    dup2(out, 1);
    int null = open("/dev/null", O_RDWR);
    dup2(null, 0);
    dup2(null, 2);
    std::string bin = testing::BinaryPath();
    execl(bin.c_str(), bin.c_str(), "--study", s.path.c_str(), "desk", "--port", "0", static_cast<char*>(nullptr));
    _exit(127);
  }
  std::string out;
  for (int i = 0; i < 100 && out.find('\n') == std::string::npos; ++i) {
    std::this_thread::sleep_for(std::chrono::milliseconds(50));
    out = testing::ReadFile(out_path);
  }
  CHECK(
      std::regex_match(out, std::regex("Desk for .* at http://127\\.0\\.0\\.1:[0-9]+/ \\(open it in a browser; Ctrl-C "
                                       "stops it\\)\n")));
  REQUIRE(kill(pid, SIGTERM) == 0);
  int status = 0;
  REQUIRE(waitpid(pid, &status, 0) == pid);
  CHECK(WIFEXITED(status));
  CHECK(WEXITSTATUS(status) == 0);
  CHECK(testing::ReadFile(out_path) == out + "Desk stopped.\n");
}
