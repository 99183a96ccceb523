// `import applications --scores`: scores of ordered groups stored with the
// levels, so the trend test runs on imported records; a score for a group
// the file does not hold, or a group without one, is refused with the fix.
#include <catch2/catch.hpp>

#include <filesystem>
#include <string>

#include <nlohmann/json.hpp>

#include "testing/testing.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;
using testing::RunCli;

namespace {

// 30 applications per age band in 6 requisitions: 12, 9 and 4 invited.
std::string WriteAgeFile(const testing::TempDir& dir) {
  std::string csv = "req,age_band,invited\n";
  const std::pair<const char*, int> bands[] = {{"a28", 12}, {"a45", 9}, {"a58", 4}};
  for (int i = 0; i < 30; ++i)
    for (const auto& [band, invited] : bands)
      csv += "R" + std::to_string(i % 6) + "," + band + "," + (i < invited ? "yes" : "no") + "\n";
  const std::string path = dir / "ages.csv";
  testing::WriteFile(path, csv);
  return path;
}

std::vector<std::string> Args(const std::string& study, const std::string& file, const std::string& scores) {
  return {"--study", study, "import", "applications", file, "--kind", "unpaired", "--columns",
          "vacancy=req,arm=age_band,outcome=invited", "--reference", "a28", "--factor", "age", "--positive", "yes",
          "--scores", scores};
}

}  // namespace

TEST_CASE("import applications: --scores stores the groups' scores and the trend test runs as R prop.trend.test") {
  testing::TempDir dir;
  const std::string study = dir / "ages";
  auto r = RunCli(Args(study, WriteAgeFile(dir), "a28=28,a45=45,a58=58"));
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(RunCli({"--study", study, "--json", "analyze"}).out);
  const auto& factor = j["k_levels"]["factors"][0];
  CHECK(factor["name"] == "age");
  CHECK(factor["levels"][0]["probes"] == 30);
  CHECK(factor["levels"][0]["positive"] == 12);
  const auto& trend = factor["trend"];
  CHECK(trend["test"] == "Cochran-Armitage");
  CHECK(trend["scores"] == std::vector<double>{28, 45, 58});
  // prop.trend.test(c(12, 9, 4), c(30, 30, 30), score = c(28, 45, 58)): X-squared, p-value
  CHECK_THAT(trend["statistic"].get<double>(), WithinRel(5.168795740342138068, 1e-9));
  CHECK_THAT(trend["p"].get<double>(), WithinRel(0.022996152300818709, 1e-9));
}

TEST_CASE("import applications: --scores for an unknown group or missing a group is refused with the fix") {
  testing::TempDir dir;
  const std::string file = WriteAgeFile(dir);
  const std::string study = dir / "ages";
  auto unknown = RunCli(Args(study, file, "a28=28,a45=45,a59=58"));
  CHECK(unknown.exit_code == 1);
  CHECK(unknown.err == "twinprobe: --scores: 'a59' is not a group of " + file +
                           " (did you mean 'a58'?) \u2014 give scores to the groups of the file: a28, a45, a58\n");
  auto missing = RunCli(Args(study, file, "a28=28,a45=45"));
  CHECK(missing.exit_code == 1);
  CHECK(missing.err == "twinprobe: --scores: the group 'a58' has no score \u2014 give every group a score, e.g. "
                       "--scores a58=NUMBER, or leave --scores out\n");
  auto not_a_number = RunCli(Args(study, file, "a28=28,a45=old,a58=58"));
  CHECK(not_a_number.exit_code == 1);
  CHECK(not_a_number.err ==
        "twinprobe: --scores: the score of 'a45' ('old') is not a number \u2014 write a number after '=', e.g. a45=28\n");
  CHECK_FALSE(std::filesystem::exists(dir / "ages/study.db"));
}
