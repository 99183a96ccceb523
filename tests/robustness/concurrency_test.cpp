// Concurrency (issue 12): four processes recording and importing into one
// study at once lose nothing and show no busy error to the user.
#include <catch2/catch.hpp>

#include <sys/wait.h>

#include <algorithm>
#include <cstdlib>
#include <thread>

#include "collector/fetch_fixture.h"
#include "core/audit.h"
#include "core/import_lock.h"
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
  // A response needs a sending: all 800 probes left on the season's first day,
  // in one `import sendings` before the writers start.
  std::string sendings = "probe,sent_at\n";
  for (int i = 1; i <= 800; ++i) {
    char line[32];
    std::snprintf(line, sizeof line, "P%05d,2027-03-01\n", i);
    sendings += line;
  }
  testing::WriteFile(dir / "sendings.csv", sendings);
  REQUIRE(testing::RunCli({"--study", study, "import", "sendings", dir / "sendings.csv"}).exit_code == 0);

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
    // No busy error and no failure shown to the user.
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
  CHECK(store.value()->QueryInt("SELECT count(*) FROM audit") == 1 + 1 + 400 + 2);
  CHECK(VerifyAudit(*store.value()).ok());
}

// Issue 23: two appending `import pairs` at once both checked their file
// against the same study, and the second failed inside SQLite ("UNIQUE
// constraint failed", exit 3). Now one holds the study's import lock and the
// other is told so in one line, or waits its turn; nothing else.
namespace {

std::string PairsCsv(int first, int count) {
  std::string csv = "vacancy,arm,outcome,occupation\n";
  for (int i = first; i < first + count; ++i)
    for (const char* arm : {"inland", "coastal"})
      csv += "V" + std::to_string(i) + "," + arm + "," + std::to_string(i % 3 == 0) + ",clerk\n";
  return csv;
}

}  // namespace

TEST_CASE("issue 23: an import while another holds the study's import lock gets one line, the store unchanged") {
  testing::TempDir dir;
  const std::string study = dir / "s";
  testing::WriteFile(dir / "base.csv", PairsCsv(1, 50));
  testing::WriteFile(dir / "more.csv", PairsCsv(1001, 50));
  auto base = testing::RunCli({"--study", study, "import", "pairs", dir / "base.csv", "--reference", "inland",
                               "--strata", "occupation"});
  INFO(base.err);
  REQUIRE(base.exit_code == 0);
  std::string head_before;
  {
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    head_before = AuditHead(*store.value());
  }
  {
    auto held = AcquireImportLock(study + "/study.db");
    REQUIRE(held.ok());
    const std::string started = testing::ReadFile(study + "/study.db.import-lock");
    auto r = testing::RunCli({"--study", study, "import", "pairs", dir / "more.csv"});
    CHECK(r.exit_code == 1);
    CHECK(r.err == "twinprobe: " + study + "/study.db: another import is running in this study (started " + started +
                       ") \u2014 try again when it ends\n");
  }
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  CHECK(AuditHead(*store.value()) == head_before);
  // Released with its holder: the same import now lands.
  auto again = testing::RunCli({"--study", study, "import", "pairs", dir / "more.csv"});
  INFO(again.err);
  CHECK(again.exit_code == 0);
}

TEST_CASE("issue 23: two appending imports at once land or refuse in one line, never an internal error") {
  testing::TempDir dir;
  const std::string study = dir / "s";
  testing::WriteFile(dir / "base.csv", PairsCsv(1, 50));
  REQUIRE(testing::RunCli({"--study", study, "import", "pairs", dir / "base.csv", "--reference", "inland", "--strata",
                           "occupation"})
              .exit_code == 0);
  testing::WriteFile(dir / "a.csv", PairsCsv(1001, 2000));
  testing::WriteFile(dir / "b.csv", PairsCsv(5001, 2000));
  auto command = [&](const std::string& file, const std::string& err) {
    return Quote(testing::BinaryPath()) + " --study " + Quote(study) + " import pairs " + Quote(dir / file) +
           " >/dev/null 2>" + Quote(dir / err);
  };
  int codes[2] = {-1, -1};
  std::thread a([&] { codes[0] = std::system(command("a.csv", "a.err").c_str()); });
  std::thread b([&] { codes[1] = std::system(command("b.csv", "b.err").c_str()); });
  a.join();
  b.join();
  int landed = 0;
  for (int k = 0; k < 2; ++k) {
    const std::string err = testing::ReadFile(dir / (k == 0 ? "a.err" : "b.err"));
    INFO(err);
    CHECK(err.find("UNIQUE") == std::string::npos);
    if (codes[k] == 0) {
      ++landed;
    } else {
      CHECK(WEXITSTATUS(codes[k]) == 1);
      CHECK(err.rfind("twinprobe: " + study + "/study.db: another import is running in this study (started ", 0) == 0);
      const std::string tail = ") \u2014 try again when it ends\n";
      CHECK(err.size() > tail.size());
      CHECK(err.compare(err.size() - tail.size(), tail.size(), tail) == 0);
      CHECK(std::count(err.begin(), err.end(), '\n') == 1);
    }
  }
  CHECK(landed >= 1);
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  CHECK(store.value()->QueryInt("SELECT count(*) FROM current_probe") == 2 * (50 + 2000 * landed));
  CHECK(VerifyAudit(*store.value()).ok());
}

// Issue 23: two `fetch` runs against one host each kept the host's minimum
// interval for their own requests only, so together they asked twice as
// often. The interval is now kept through a per-host lock file in the study
// (core/host_pacing.h); the server's own log shows the times.
TEST_CASE("issue 23: two fetch runs at once keep the minimum interval per host between them") {
  testing::FixtureServer server;
  testing::TempDir dir;
  const std::string study = dir / "study";
  // The fixture board's study, one query of three pages, half a second apart.
  std::string toml = testing::ListingStudyToml(server);
  const std::vector<std::pair<std::string, std::string>> edits = {
      {"queries = [\"search\", \"private\", \"broken\", \"missing-field\", \"fail\", \"away\", \"empty\", \"moved\"]",
       "queries = [\"search\"]\npages = 3"},
      {"min_interval_seconds = 0.1", "min_interval_seconds = 0.5"}};
  for (const auto& [from, to] : edits) {
    REQUIRE(toml.find(from) != std::string::npos);
    toml.replace(toml.find(from), from.size(), to);
  }
  testing::WriteFile(study + "/study.toml", toml);
  auto command = [&](const std::string& err) {
    return "no_proxy='*' http_proxy= " + Quote(testing::BinaryPath()) + " --study " + Quote(study) +
           " fetch >/dev/null 2>" + Quote(dir / err);
  };
  int codes[2] = {-1, -1};
  std::thread a([&] { codes[0] = std::system(command("a.err").c_str()); });
  std::thread b([&] { codes[1] = std::system(command("b.err").c_str()); });
  a.join();
  b.join();
  INFO(testing::ReadFile(dir / "a.err") << testing::ReadFile(dir / "b.err"));
  CHECK(codes[0] == 0);
  CHECK(codes[1] == 0);
  auto seen = server.Requests();
  CHECK(seen.size() == 8);  // robots.txt and three pages, by each run
  std::vector<double> times;
  for (const auto& r : seen) times.push_back(r.t);
  std::sort(times.begin(), times.end());
  for (size_t i = 1; i < times.size(); ++i) {
    INFO("request " << i << " came " << times[i] - times[i - 1] << " s after the one before");
    // Each request starts at least the interval after the previous one ended.
    CHECK(times[i] - times[i - 1] >= 0.49);
  }
}
