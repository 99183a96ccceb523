// Crash consistency (issue 12): a command killed with SIGKILL at a random
// point leaves a store that passes integrity_check and verify, holds either
// all of the command's effect or none of it, and re-running the command gives
// the same store content as an uninterrupted run.
#include <catch2/catch.hpp>

#include <signal.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <thread>

#include "core/audit.h"
#include "core/store.h"
#include "stats/random.h"
#include "testing/testing.h"

using namespace twinprobe;
namespace fs = std::filesystem;

namespace {

// After the responses imported below (fieldwork times may not lie in the future).
const std::vector<std::string> kPinnedTime = {"TWINPROBE_NOW=2027-05-20T08:00:00Z", "TWINPROBE_ACTOR=tester"};

// The current plan's content without row ids, random keys or timestamps of
// entry: what a reader of the study relies on.
std::string DumpCurrentPlan(Store& s) {
  std::string out;
  Stmt q = s.Prepare(
      "SELECT p.ref, v.ref, e.name, a.label, pr.display_name, p.template, p.send_order, p.planned_at, "
      "  (SELECT group_concat(name || '=' || value, ';') FROM vacancy_stratum vs WHERE vs.vacancy_id = v.id) "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "LEFT JOIN employer e ON e.key = v.employer_key LEFT JOIN profile pr ON pr.id = p.profile_id ORDER BY p.ref");
  while (q.Step()) {
    for (int c = 0; c < q.ColumnCount(); ++c) out += q.Text(c) + "|";
    out += "\n";
  }
  return out;
}

std::string DumpResponses(Store& s) {
  std::string out;
  Stmt q = s.Prepare(
      "SELECT p.ref, r.code, r.received_at, coalesce(r.channel, ''), r.origin, r.flags "
      "FROM current_response r JOIN probe p ON p.id = r.probe_id ORDER BY p.ref, r.id");
  while (q.Step()) {
    for (int c = 0; c < q.ColumnCount(); ++c) out += q.Text(c) + "|";
    out += "\n";
  }
  return out;
}

void CheckHealthy(const std::string& db) {
  auto store = Store::Open(db, false);
  REQUIRE(store.ok());
  Stmt ic = store.value()->Prepare("PRAGMA integrity_check");
  REQUIRE(ic.Step());
  CHECK(ic.Text(0) == "ok");
  CHECK(VerifyAudit(*store.value()).ok());
}

// Kills `args` after a random delay in [0, max_delay_us]. Returns true if the
// process was still running when the signal arrived.
bool RunAndKill(const std::vector<std::string>& args, stats::Rng& rng, int64_t max_delay_us) {
  int pid = testing::SpawnCli(args, kPinnedTime);
  std::this_thread::sleep_for(std::chrono::microseconds(rng.Between(0, max_delay_us)));
  kill(pid, SIGKILL);
  return testing::WaitCli(pid) == -SIGKILL;
}

int64_t TimeUs(const std::vector<std::string>& args) {
  auto t0 = std::chrono::steady_clock::now();
  REQUIRE(testing::RunCli(args, kPinnedTime).exit_code == 0);
  return std::chrono::duration_cast<std::chrono::microseconds>(std::chrono::steady_clock::now() - t0).count();
}

}  // namespace

TEST_CASE("crash consistency: plan killed at random points is all or nothing, and a re-run matches") {
  testing::TempDir dir;
  std::string base = dir / "baseline";
  REQUIRE(testing::RunCli({"--study", base, "init"}).exit_code == 0);
  int64_t duration = TimeUs({"--study", base, "plan"});
  std::string expected;
  {
    auto s = Store::Open(base + "/study.db", false);
    expected = DumpCurrentPlan(*s.value());
  }
  REQUIRE(expected.size() > 1000);

  stats::Rng rng(20270301);
  const int kTrials = 30;
  int killed_while_running = 0;
  for (int trial = 0; trial < kTrials; ++trial) {
    std::string study = dir / ("trial" + std::to_string(trial));
    REQUIRE(testing::RunCli({"--study", study, "init"}).exit_code == 0);
    killed_while_running += RunAndKill({"--study", study, "plan"}, rng, duration * 3 / 2);
    if (fs::exists(study + "/study.db")) {
      CheckHealthy(study + "/study.db");
      auto s = Store::Open(study + "/study.db", false);
      int64_t probes = s.value()->QueryInt("SELECT count(*) FROM probe");
      int64_t plans = s.value()->QueryInt("SELECT count(*) FROM plan");
      INFO("trial " << trial);
      CHECK(((plans == 0 && probes == 0) || (plans == 1 && probes == 800)));
    }
    REQUIRE(testing::RunCli({"--study", study, "plan"}, kPinnedTime).exit_code == 0);
    auto s = Store::Open(study + "/study.db", false);
    CHECK(DumpCurrentPlan(*s.value()) == expected);
    CHECK(VerifyAudit(*s.value()).ok());
  }
  WARN("plan: " << kTrials << " kill trials, " << killed_while_running << " killed while running");
  CHECK(killed_while_running > 0);
}

TEST_CASE("crash consistency: import outcomes killed at random points is all or nothing, and a re-run matches") {
  testing::TempDir dir;
  // 800 responses, one per probe, with notes so the import does real work.
  std::string csv = "probe,code,received_at,channel,note\n";
  for (int i = 1; i <= 800; ++i) {
    char line[160];
    std::snprintf(line, sizeof line, "P%05d,%s,2027-04-%02dT10:00,mail,entered from the field log line %d\n", i,
                  i % 3 == 0 ? "invitation" : "rejection", 1 + i % 28, i);
    csv += line;
  }
  testing::WriteFile(dir / "responses.csv", csv);
  // A response needs a sending: every probe left on the season's first day.
  std::string sendings = "probe,sent_at\n";
  for (int i = 1; i <= 800; ++i) {
    char line[32];
    std::snprintf(line, sizeof line, "P%05d,2027-03-01\n", i);
    sendings += line;
  }
  testing::WriteFile(dir / "sendings.csv", sendings);
  auto make_study = [&](const std::string& study) {
    REQUIRE(testing::RunCli({"--study", study, "init"}).exit_code == 0);
    REQUIRE(testing::RunCli({"--study", study, "plan"}, kPinnedTime).exit_code == 0);
    REQUIRE(testing::RunCli({"--study", study, "import", "sendings", dir / "sendings.csv"}, kPinnedTime).exit_code ==
            0);
  };
  std::string base = dir / "baseline";
  make_study(base);
  int64_t duration = TimeUs({"--study", base, "import", "outcomes", dir / "responses.csv"});
  std::string expected;
  {
    auto s = Store::Open(base + "/study.db", false);
    expected = DumpResponses(*s.value());
  }
  REQUIRE(std::count(expected.begin(), expected.end(), '\n') == 800);

  stats::Rng rng(4242);
  const int kTrials = 30;
  int killed_while_running = 0;
  for (int trial = 0; trial < kTrials; ++trial) {
    std::string study = dir / ("trial" + std::to_string(trial));
    make_study(study);
    killed_while_running += RunAndKill({"--study", study, "import", "outcomes", dir / "responses.csv"}, rng,
                                       duration * 3 / 2);
    CheckHealthy(study + "/study.db");
    {
      auto s = Store::Open(study + "/study.db", false);
      int64_t n = s.value()->QueryInt("SELECT count(*) FROM response");
      INFO("trial " << trial);
      CHECK((n == 0 || n == 800));
    }
    REQUIRE(testing::RunCli({"--study", study, "import", "outcomes", dir / "responses.csv"}, kPinnedTime).exit_code ==
            0);
    auto s = Store::Open(study + "/study.db", false);
    CHECK(DumpResponses(*s.value()) == expected);
    CHECK(VerifyAudit(*s.value()).ok());
  }
  WARN("import outcomes: " << kTrials << " kill trials, " << killed_while_running << " killed while running");
  CHECK(killed_while_running > 0);
}
