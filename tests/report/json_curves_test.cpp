// The response-time curves in `analyze --json` / `report --json`: read at
// each day of the window (`by_day`), so the document's size follows the
// window, not the number of distinct response times; every other number of
// the document is what it was when the curves were written step by step.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "report/json_report.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// Only the numbers, booleans and nulls of a document, by JSON pointer; the
// sentences are other pages' wording and are compared where they are written.
nlohmann::json Numbers(const nlohmann::json& document) {
  nlohmann::json out = nlohmann::json::object();
  const nlohmann::json flat = document.flatten();  // kept alive for the loop
  for (const auto& [pointer, value] : flat.items())
    // flatten() writes an empty array or object as null: not a leaf.
    if (!value.is_string() && (!value.is_null() || document.at(nlohmann::json::json_pointer(pointer)).is_null()))
      out[pointer] = value;
  return out;
}

}  // namespace

TEST_CASE("analyze --json: every number but the curves is as it was with the per-step curves") {
  // The demo's analyze --json written by the renderer that still carried
  // first_response[] and first_positive[] (one point per distinct response
  // time), with those two keys taken out, then reduced to its numbers.
  const nlohmann::json before =
      nlohmann::json::parse(testing::ReadFile(std::string(TWINPROBE_SOURCE_DIR) + "/tests/fixtures/report/demo_analyze_numbers.json"));
  testing::TempDir dir;
  const std::string study = dir / "demo";
  const std::vector<std::string> now = {"TWINPROBE_NOW=2027-04-26T14:59:00Z"};
  REQUIRE(RunCli({"demo", "--out", study}, now).exit_code == 0);
  const auto run = RunCli({"--study", study, "--json", "analyze"}, now);
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  nlohmann::json after = nlohmann::json::parse(run.out);
  REQUIRE(after["response_times"]["arms"].size() == 2);
  for (auto& arm : after["response_times"]["arms"]) {
    CHECK_FALSE(arm.contains("first_response"));
    CHECK_FALSE(arm.contains("first_positive"));
    CHECK(arm["by_day"].size() == 28);
    arm.erase("by_day");
  }
  const nlohmann::json now_numbers = Numbers(after);
  std::vector<std::string> differing;
  for (const auto& [pointer, value] : before.items())
    if (!now_numbers.contains(pointer) || now_numbers[pointer] != value) differing.push_back(pointer);
  // Keys added since (by other work) are not compared: only that nothing
  // the document held before changed or went missing.
  INFO(differing.size() << " keys differ, first: " << (differing.empty() ? "" : differing.front()));
  CHECK(differing.empty());
  CHECK(before.size() > 1000);  // the whole document, not a stub
}

TEST_CASE("json report: the curves are one row a day however many distinct response times") {
  AnalysisResult r;
  r.kind = "paired";
  r.response_times.available = true;
  r.response_times.window_days = 28;
  ArmResponseTimes a;
  a.label = "origin=inland";
  a.is_reference = true;
  a.probes_sent = 200000;
  // 100,000 distinct response times, one every 24 seconds: as many steps.
  for (int i = 0; i < 100000; ++i) a.any.push_back({i * 24.0 / 86400.0, i + 1, (i + 1) / 200000.0});
  a.positive = a.any;
  for (int day = 1; day <= 28; ++day) {
    const int64_t count = std::min<int64_t>(100000, day * 3600);
    a.by_day.push_back({day, count, count / 200000.0, count, count / 200000.0});
  }
  a.milestones = {a.by_day[6], a.by_day[27]};
  r.response_times.arms.push_back(a);
  const nlohmann::json j = nlohmann::json::parse(RenderJsonReport(r));
  const auto& arm = j["response_times"]["arms"][0];
  REQUIRE(arm["by_day"].size() == 28);
  CHECK(arm["by_day"][0] == nlohmann::json{{"day", 1}, {"any", 3600}, {"any_share", 0.018}, {"positive", 3600}, {"positive_share", 0.018}});
  CHECK(arm["by_day"][27]["any"] == 100000);
  CHECK(arm["by_day"][27]["any_share"] == 0.5);
  CHECK(arm["milestones"][0]["day"] == 7);
  CHECK(arm["milestones"][1]["day"] == 28);
  CHECK(RenderJsonReport(r).size() < 20000);
}
