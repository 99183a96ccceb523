// Issue 23: every input's cost is bounded before it is spent, and a value
// quoted back in a message is cut. A 40,000-column header took 27 s (each
// name compared with every other), a 2 MB unknown key was echoed whole (and
// compared letter by letter with every allowed key), and a vacancies file
// was planned at any length. Peak memory is asserted in a forked child.
#include <catch2/catch.hpp>

#include <chrono>
#include <filesystem>
#include <string>

#include "core/audit.h"
#include "core/store.h"
#include "planner/design_file.h"
#include "planner/study_check.h"
#include "robustness/peak_memory.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::PeakKbInChild;
namespace fs = std::filesystem;

namespace {

constexpr long kBoundKb = 150 * 1024;

std::string Fixture() { return testing::SourceDir() + "/tests/robustness/fixture_study"; }

// The fixture copied and planned, as the bad-input battery starts.
std::string PlannedStudy(const testing::TempDir& dir) {
  std::string study = dir / "study";
  fs::copy(Fixture(), study, fs::copy_options::recursive);
  REQUIRE(testing::RunCli({"--study", study, "plan"}).exit_code == 0);
  return study;
}

// The fixture with `n` invented vacancies (one employer each), not planned.
std::string StudyWithVacancies(const testing::TempDir& dir, int n) {
  std::string study = dir / "study";
  fs::copy(Fixture(), study, fs::copy_options::recursive);
  std::string csv = "vacancy,employer,contact,occupation,region,opened_on\n";
  for (int i = 1; i <= n; ++i)
    csv += "V" + std::to_string(i) + ",Firm " + std::to_string(i) + " (invented),,bookkeeper,North Fen,2027-02-01\n";
  testing::WriteFile(study + "/vacancies.csv", csv);
  return study;
}

std::string Head(const std::string& study) {
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  return AuditHead(*store.value());
}

double SecondsSince(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

}  // namespace

TEST_CASE("issue 23: an unknown 2 MB design key is echoed cut to 80 characters, at once and under 150 MB") {
  std::string text = testing::ReadFile(Fixture() + "/study.toml");
  const std::string key(2 << 20, 'k');
  text.replace(text.find("seed = 20270301"), 15, "seed = 20270301\n" + key + " = 1");
  auto start = std::chrono::steady_clock::now();
  auto d = ParseDesign(text, "study.toml", Fixture());
  const double seconds = SecondsSince(start);
  REQUIRE_FALSE(d.ok());
  // The position is the value's (after the key and " = ").
  CHECK(d.error().Message() == "study.toml:10:2097156: unknown key '" + std::string(80, 'k') +
                                   "\u2026 (2,097,152 bytes)' in [study] \u2014 the keys allowed here are: id, title, "
                                   "seed, kind");
  CHECK(seconds < 2.0);
  const long kb = PeakKbInChild([&] { return !ParseDesign(text, "study.toml", Fixture()).ok(); });
  INFO("peak " << kb << " KB");
  CHECK(kb > 0);
  CHECK(kb < kBoundKb);
}

TEST_CASE("issue 23: a 40,000-column header is refused in well under a second, the store unchanged") {
  testing::TempDir dir;
  const std::string study = PlannedStudy(dir);
  std::string header = "probe,code,received_at";
  for (int i = 4; i <= 40000; ++i) header += ",c" + std::to_string(i);
  testing::WriteFile(study + "/wide.csv", header + "\nP00001,invitation,2027-04-01\n");
  const std::string before = Head(study);
  auto start = std::chrono::steady_clock::now();
  auto r = testing::RunCli({"--study", study, "import", "outcomes", study + "/wide.csv"});
  const double seconds = SecondsSince(start);
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + study +
                     "/wide.csv:1: the header has 40,000 columns, more than the 1,000 a file may have \u2014 keep "
                     "only the columns the command reads\n");
  CHECK(seconds < 1.0);
  CHECK(Head(study) == before);
}

TEST_CASE("issue 23: a 2 MB CSV value is echoed cut to 80 characters, the store unchanged") {
  testing::TempDir dir;
  const std::string study = PlannedStudy(dir);
  const std::string probe = "P" + std::string((2 << 20) - 1, '9');
  testing::WriteFile(study + "/long.csv", "probe,code,received_at\n" + probe + ",invitation,2027-04-01\n");
  const std::string before = Head(study);
  auto r = testing::RunCli({"--study", study, "import", "outcomes", study + "/long.csv"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + study + "/long.csv:2: unknown probe '" + probe.substr(0, 80) +
                     "\u2026 (2,097,152 bytes)' \u2014 use a probe reference from 'twinprobe schedule' or the plan "
                     "(e.g. P00001)\n");
  CHECK(Head(study) == before);
}

TEST_CASE("issue 23: a plan past 100,000 probes is refused at check with the count and the bound, under 150 MB") {
  testing::TempDir dir;
  // 60,000 vacancies x 2 arms = 120,000 probes; the first 50,000 are kept,
  // the rest counted.
  const std::string study = StudyWithVacancies(dir, 60000);
  const std::string message =
      study + "/vacancies.csv: the plan would have 120,000 probes (60,000 vacancies \u00d7 2 probes each), more than "
              "the 100,000 a plan may have \u2014 split the vacancies into studies of at most 50,000 vacancies";
  auto checked = CheckStudy(study);
  REQUIRE_FALSE(checked.ok());
  CHECK(checked.error().Message() == message);
  auto r = testing::RunCli({"--study", study, "plan"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + message + "\n");
  CHECK_FALSE(fs::exists(study + "/study.db"));
  const long kb = PeakKbInChild([&] { return !CheckStudy(study).ok(); });
  INFO("peak " << kb << " KB");
  CHECK(kb > 0);
  CHECK(kb < kBoundKb);
}

TEST_CASE("issue 23: a plan of exactly 100,000 probes is within the bound") {
  testing::TempDir dir;
  const std::string study = StudyWithVacancies(dir, 50000);
  auto checked = CheckStudy(study);
  REQUIRE(checked.ok());
  CHECK(checked.value().vacancies.size() == 50000);
}
