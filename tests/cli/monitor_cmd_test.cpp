// End-to-end tests of `twinprobe monitor` on real study folders: the example
// study (400 vacancies, [analysis] looks = [200]) planned by the real
// planner, outcomes imported from CSV with chosen times.
#include <catch2/catch.hpp>

#include <cstdio>

#include <nlohmann/json.hpp>

#include "core/store.h"
#include "stats/sequential.h"
#include "testing/pinned_clock.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

struct SetProbes {
  std::string reference, other;
};

struct MonitoredStudy {
  testing::PinnedClock clock;  // the season's end: fieldwork times may not lie in the future
  testing::TempDir dir;
  std::string study;
  std::vector<SetProbes> sets;  // in vacancy order
  MonitoredStudy() : study(dir / "s") {
    REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
    auto plan = RunCli({"--study", study, "plan"});
    INFO(plan.err);
    REQUIRE(plan.exit_code == 0);
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    Stmt q = store.value()->Prepare(
        "SELECT p.vacancy_id, p.ref, a.is_reference FROM current_probe p JOIN arm a ON a.id = p.arm_id "
        "ORDER BY p.vacancy_id, a.is_reference DESC");
    int64_t last = -1;
    while (q.Step()) {
      if (q.Int(0) != last) sets.emplace_back(), last = q.Int(0);
      (q.Int(2) ? sets.back().reference : sets.back().other) = q.Text(1);
    }
    REQUIRE(sets.size() == 400);
  }
  // Imports outcomes: pattern[i] is 'a' (both called back), 'b' (reference
  // only), 'c' (other only) or 'd' (neither) for the set with hour[i].
  void Import(const std::string& pattern, const std::vector<int>& hour) {
    // A response needs a sending: the sets answered were sent first.
    std::string sendings = "probe,sent_at\n";
    for (size_t i = 0; i < pattern.size(); ++i)
      sendings += sets[i].reference + ",2027-03-01T00:00\n" + sets[i].other + ",2027-03-01T00:00\n";
    testing::WriteFile(study + "/sendings.csv", sendings);
    auto sent = RunCli({"--study", study, "import", "sendings", study + "/sendings.csv"});
    INFO(sent.err);
    REQUIRE(sent.exit_code == 0);
    std::string csv = "probe,code,received_at\n";
    for (size_t i = 0; i < pattern.size(); ++i) {
      const char k = pattern[i];
      char at[32];
      std::snprintf(at, sizeof at, "2027-03-%02dT%02d:00", 1 + hour[i] / 24, hour[i] % 24);
      csv += sets[i].reference + "," + ((k == 'a' || k == 'b') ? "invitation" : "rejection") + "," + at + "\n";
      csv += sets[i].other + "," + ((k == 'a' || k == 'c') ? "invitation" : "rejection") + "," + at + "\n";
    }
    testing::WriteFile(study + "/outcomes.csv", csv);
    auto r = RunCli({"--study", study, "import", "outcomes", study + "/outcomes.csv"});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  }
};

std::vector<int> Hours(size_t n) {
  std::vector<int> h;
  for (size_t i = 0; i < n; ++i) h.push_back(static_cast<int>(i % 600));
  return h;
}

std::string Pattern(int b, int c, int d) { return std::string(b, 'b') + std::string(c, 'c') + std::string(d, 'd'); }

}  // namespace

TEST_CASE("monitor cli: a strong imbalance at the first look stops with the stage-wise p-value") {
  MonitoredStudy s;
  s.Import(Pattern(40, 8, 152), Hours(200));
  auto r = RunCli({"--study", s.study, "--json", "monitor"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["decision"] == "stop");
  CHECK(j["stopped_at_look"] == 1);
  CHECK(j["completed_sets"] == 200);
  CHECK(j["planned_sets"] == 400);
  REQUIRE(j["looks"].size() == 1);
  CHECK(j["looks"][0]["discordant"] == 48);
  CHECK(j["looks"][0]["reference_only"] == 40);
  CHECK(j["looks"][0]["information"] == 0.5);
  // Independent recomputation from stats/sequential.h.
  auto bounds = stats::ExactSequentialBoundaries({{0.5, 48}}, 0.05, stats::Spending::kOBrienFleming);
  CHECK(j["looks"][0]["stop_at"] == bounds[0].upper());
  CHECK_THAT(j["adjusted_p"].get<double>(), WithinRel(stats::StagewisePValue(bounds, 0, 40), 1e-12));
  CHECK(j["adjusted_p"].get<double>() <= j["exact_type_i_error_so_far"].get<double>());
  CHECK(j["favoured"] == "origin=inland");

  auto text = RunCli({"--study", s.study, "monitor"});
  CHECK(text.out.find("Decision: stop. At look 1 (200 completed sets) the origin=inland arm alone was called back in "
                      "40 of 48 discordant sets") != std::string::npos);
}

TEST_CASE("monitor cli: a moderate imbalance continues to the next planned look") {
  MonitoredStudy s;
  s.Import(Pattern(20, 15, 215), Hours(250));
  auto r = RunCli({"--study", s.study, "--json", "monitor", "--spending", "pocock"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["decision"] == "continue");
  CHECK(j["next_look_sets"] == 400);
  CHECK(j["completed_sets"] == 250);
  CHECK(j["spending"] == "pocock");
  CHECK(j["adjusted_p"].is_null());
  CHECK(j["looks"][0]["crossed"] == false);
  CHECK(j["exact_type_i_error_so_far"].get<double>() <= stats::AlphaSpent(stats::Spending::kPocock, 0.05, 0.5));
  auto text = RunCli({"--study", s.study, "monitor", "--spending", "pocock"});
  CHECK(text.out.find("Decision: continue. No boundary has been crossed. The next look is at 400 completed sets (250 "
                      "so far).") != std::string::npos);
}

TEST_CASE("monitor cli: looks take sets in the order they completed, not in vacancy order") {
  MonitoredStudy s;
  // The first 50 vacancies favour the reference arm but complete last.
  std::string pattern = std::string(50, 'b') + Pattern(5, 5, 190);
  std::vector<int> hours;
  for (int i = 0; i < 250; ++i) hours.push_back(i < 50 ? 500 + i : i);
  s.Import(pattern, hours);
  auto j = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "monitor"}).out);
  REQUIRE(j["looks"].size() == 1);
  CHECK(j["looks"][0]["reference_only"] == 5);  // the 50 late sets are not in the first 200
  CHECK(j["looks"][0]["other_only"] == 5);
  CHECK(j["decision"] == "continue");
}

TEST_CASE("monitor cli: --final makes the sets completed now the final analysis") {
  MonitoredStudy s;
  s.Import(Pattern(20, 15, 215), Hours(250));
  auto j = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "monitor", "--final"}).out);
  CHECK(j["schedule"] == nlohmann::json::array({200, 250}));
  REQUIRE(j["looks"].size() == 2);
  CHECK(j["looks"][1]["information"] == 1.0);
  CHECK(j["looks"][1]["final"] == true);
  CHECK(j["decision"] == "final");
  CHECK(j["adjusted_p"].get<double>() > 0.05);
  CHECK(j["exact_type_i_error_so_far"].get<double>() <= 0.05);
}

TEST_CASE("monitor cli: before the first look it waits, a bad spending name is one error line") {
  MonitoredStudy s;
  s.Import(Pattern(3, 1, 46), Hours(50));
  auto j = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "monitor"}).out);
  CHECK(j["decision"] == "waiting");
  CHECK(j["next_look_sets"] == 200);
  CHECK(j["looks"].empty());
  // Text and JSON state the decision in the same words (issue 16: the text
  // said "continue" where the JSON said "waiting").
  // Pattern(3, 1, 46): 3 + 1 + 46 = 50 sets, all complete.
  const std::string said = "Decision: waiting. No look has been reached yet; the first is at 200 completed sets (50 so "
                           "far).\n";
  CHECK(j["decision_text"] == said);
  auto text = RunCli({"--study", s.study, "monitor"}).out;
  CHECK(text.size() >= said.size());
  CHECK(text.substr(text.size() - said.size()) == said);
  auto bad = RunCli({"--study", s.study, "monitor", "--spending", "linear"});
  CHECK(bad.exit_code == 1);
  CHECK(bad.err == "twinprobe: --spending: unknown spending function 'linear' \u2014 use obf (O'Brien\u2013Fleming "
                   "type) or pocock (Pocock type)\n");
}
