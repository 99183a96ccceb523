// Issue 24, item 5: values that differ only in case or spaces are named,
// with their counts, by `import pairs`, `check` and `plan`.
#include <catch2/catch.hpp>

#include <filesystem>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// `text` with the n-th (0-based) occurrence of `from` replaced by `to`.
std::string ReplaceNth(std::string text, const std::string& from, const std::string& to, int n) {
  size_t at = text.find(from);
  for (int i = 0; i < n; ++i) at = text.find(from, at + 1);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

}  // namespace

TEST_CASE("issue 24: import pairs warns of strata spelt two ways, with both spellings and their row counts") {
  testing::TempDir dir;
  const std::string study = dir / "study";
  const std::string csv = dir / "pairs.csv";
  testing::WriteFile(csv,
                     "vacancy,arm,outcome,region\n"
                     "V1,inland,1,Harbour coast\nV1,coastal,0,Harbour coast\n"
                     "V2,inland,0,Harbour Coast\nV2,coastal,1,Harbour Coast\n"
                     "V3,inland,1,Harbour coast\nV3,coastal,1,Harbour coast\n"
                     "V4,inland,1,North Fen\nV4,coastal,0,North Fen \n");
  auto r = RunCli({"--study", study, "import", "pairs", csv, "--strata", "region", "--reference", "inland"});
  INFO(r.out);
  CHECK(r.exit_code == 1);  // V4 has two regions: the row names it
  CHECK(r.err == "twinprobe: " + csv +
                     ":9: vacancy 'V4' has region 'North Fen ' here but 'North Fen' on line 8 \u2014 a vacancy's strata "
                     "are the same on all its rows\n");
  testing::WriteFile(csv,
                     "vacancy,arm,outcome,region\n"
                     "V1,inland,1,Harbour coast\nV1,coastal,0,Harbour coast\n"
                     "V2,inland,0,Harbour Coast\nV2,coastal,1,Harbour Coast\n"
                     "V3,inland,1,Harbour coast\nV3,coastal,1,Harbour coast\n"
                     "V4,inland,1,North Fen\nV4,coastal,0,North Fen\n");
  auto ok = RunCli({"--study", study, "import", "pairs", csv, "--strata", "region", "--reference", "inland"});
  CHECK(ok.exit_code == 0);
  CHECK(ok.err == "twinprobe: warning: the column 'region' holds 'Harbour coast' (4 rows) and 'Harbour Coast' (2 rows), "
                  "which differ only in case or spaces and so count as two values; write them alike if they are one\n");
}

TEST_CASE("issue 24: check and plan warn of a stratum spelt with another case or a trailing space") {
  testing::PlannedStudy s(false);
  const std::string file = s.path + "/vacancies.csv";
  std::string text = testing::ReadFile(file);
  text = ReplaceNth(text, ",Harbour Coast,", ",Harbour coast,", 0);
  text = ReplaceNth(text, ",Harbour Coast,", ",Harbour Coast ,", 5);
  testing::WriteFile(file, text);
  const std::string warning =
      "twinprobe: warning: the column 'region' holds 'Harbour Coast' (130 vacancies), 'Harbour coast' (1 vacancy) "
      "and 'Harbour Coast ' (1 vacancy), which differ only in case or spaces and so count as 3 values; write them "
      "alike if they are one\n";
  auto check = RunCli({"--study", s.path, "check"});
  CHECK(check.err == warning);
  auto plan = RunCli({"--study", s.path, "plan"});
  CHECK(plan.err == warning);
}
