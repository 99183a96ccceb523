// Issue 16: monitoring looks are records. Three looks through time on the
// example study (400 vacancies, [analysis] looks = [120] here, O'Brien–Fleming
// type spending): a planned look, an unplanned --look-now look and the final
// analysis, each stored and sealed, each spending only the alpha the stored
// looks left. Outcomes are imported in three batches and the study clock is
// pinned after each batch (TWINPROBE_NOW).
#include <catch2/catch.hpp>

#include <cstdio>

#include <nlohmann/json.hpp>

#include "core/monitor_looks.h"
#include "core/store.h"
#include "stats/sequential.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

struct LookedStudy {
  testing::TempDir dir;
  std::string study;
  std::vector<std::pair<std::string, std::string>> sets;  // reference probe, other probe; vacancy order
  LookedStudy() : study(dir / "s") {
    REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
    std::string toml = testing::ReadFile(study + "/study.toml");
    toml.replace(toml.find("looks = [200]"), 13, "looks = [120]");
    testing::WriteFile(study + "/study.toml", toml);
    REQUIRE(RunCli({"--study", study, "plan"}).exit_code == 0);
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    Stmt q = store.value()->Prepare(
        "SELECT p.vacancy_id, p.ref, a.is_reference FROM current_probe p JOIN arm a ON a.id = p.arm_id "
        "ORDER BY p.vacancy_id, a.is_reference DESC");
    int64_t last = -1;
    while (q.Step()) {
      if (q.Int(0) != last) sets.emplace_back(), last = q.Int(0);
      (q.Int(2) ? sets.back().first : sets.back().second) = q.Text(1);
    }
    REQUIRE(sets.size() == 400);
  }
  // Sets [from, from + pattern.size()) answered on `day` of March 2027, one an
  // hour: 'b' reference only, 'c' other only, 'd' neither.
  void Import(size_t from, const std::string& pattern, int day) {
    std::string csv = "probe,code,received_at\n";
    for (size_t i = 0; i < pattern.size(); ++i) {
      char at[32];
      std::snprintf(at, sizeof at, "2027-03-%02dT%02zu:%02zu", day, i / 60 % 24, i % 60);
      const char k = pattern[i];
      csv += sets[from + i].first + "," + (k == 'b' ? "invitation" : "rejection") + "," + at + "\n";
      csv += sets[from + i].second + "," + (k == 'c' ? "invitation" : "rejection") + "," + at + "\n";
    }
    // A response needs a sending: the batch's probes left on the season's first day.
    std::string sendings = "probe,sent_at\n";
    for (size_t i = 0; i < pattern.size(); ++i)
      sendings += sets[from + i].first + ",2027-03-01\n" + sets[from + i].second + ",2027-03-01\n";
    testing::WriteFile(study + "/sendings.csv", sendings);
    auto sent = RunCli({"--study", study, "import", "sendings", study + "/sendings.csv"}, {Now(day)});
    INFO(sent.err);
    REQUIRE(sent.exit_code == 0);
    testing::WriteFile(study + "/outcomes.csv", csv);
    auto r = RunCli({"--study", study, "import", "outcomes", study + "/outcomes.csv"}, {Now(day)});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  }
  static std::string Now(int day) {
    char at[64];
    std::snprintf(at, sizeof at, "TWINPROBE_NOW=2027-03-%02dT23:59:00Z", day);
    return at;
  }
  nlohmann::json Monitor(int day, std::vector<std::string> extra = {}) {
    std::vector<std::string> args{"--study", study, "--json", "monitor"};
    args.insert(args.end(), extra.begin(), extra.end());
    auto r = RunCli(args, {Now(day)});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
    return nlohmann::json::parse(r.out);
  }
  std::vector<StoredLook> Stored() {
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    return ReadMonitorLooks(*store.value());
  }
};

std::string Pattern(int b, int c, int d) { return std::string(b, 'b') + std::string(c, 'c') + std::string(d, 'd'); }

}  // namespace

TEST_CASE("monitor looks: three looks through time are stored, each spending what the stored looks left") {
  LookedStudy s;
  // Look 1, planned at 120 of 400 sets (information 0.3).
  s.Import(0, Pattern(10, 8, 102), 2);
  auto j1 = s.Monitor(3);
  CHECK(j1["new_looks"] == 1);
  CHECK(j1["decision"] == "continue");
  REQUIRE(j1["looks"].size() == 1);
  CHECK(j1["looks"][0]["kind"] == "planned");
  CHECK(j1["looks"][0]["taken_at"] == "2027-03-03T23:59:00Z");
  // Lan–DeMets O'Brien–Fleming type spending at t = 0.3 and 0.7, two-sided
  // alpha 0.05: rpact 3.3.4 getDesignGroupSequential(informationRates =
  // c(0.3, 0.7, 1), typeOfDesign = "asOF", sided = 2) reports cumulative alpha
  // spent 8.54515748894e-05 and 0.014768978653
  // (tests/reference/power/spending_boundaries.csv, design 3).
  CHECK_THAT(j1["looks"][0]["alpha_allowed"].get<double>(), WithinRel(8.54515748894e-05, 1e-9));
  // Repeating the same look at the same data adds nothing, asked for or not.
  CHECK(s.Monitor(4)["new_looks"] == 0);
  CHECK(s.Monitor(4, {"--look-now"})["new_looks"] == 0);
  REQUIRE(s.Stored().size() == 1);

  // Look 2, unplanned, at 280 sets (information 0.7).
  s.Import(120, Pattern(15, 7, 138), 10);
  auto j2 = s.Monitor(11, {"--look-now"});
  CHECK(j2["new_looks"] == 1);
  CHECK(j2["decision"] == "continue");
  REQUIRE(j2["looks"].size() == 2);
  CHECK(j2["looks"][0]["taken_before"] == true);
  CHECK(j2["looks"][1]["kind"] == "unplanned");
  CHECK(j2["looks"][1]["sets"] == 280);
  CHECK_THAT(j2["looks"][1]["alpha_allowed"].get<double>(), WithinRel(0.014768978653, 1e-8));
  CHECK(j2["schedule"] == nlohmann::json::array({120, 280, 400}));
  // The next run has not forgotten the unplanned look.
  CHECK(s.Monitor(12)["schedule"] == nlohmann::json::array({120, 280, 400}));

  // Look 3, the final analysis at 400 sets.
  s.Import(280, Pattern(15, 7, 98), 20);
  auto j3 = s.Monitor(21);
  CHECK(j3["new_looks"] == 1);
  REQUIRE(j3["looks"].size() == 3);
  CHECK(j3["looks"][2]["kind"] == "final");
  CHECK_THAT(j3["looks"][2]["alpha_allowed"].get<double>(), WithinAbs(0.05, 1e-7));  // rpact: 0.04999999

  const std::vector<StoredLook> looks = s.Stored();
  REQUIRE(looks.size() == 3);
  CHECK(looks[0].discordant == 18);
  CHECK(looks[1].discordant == 40);
  CHECK(looks[2].discordant == 62);
  CHECK(looks[2].reference_only == 40);
  // Alpha carried: the stored boundaries are those of the three looks taken
  // in turn, and the exact type I error over them, by enumeration of every
  // path, is what the last look records and stays within alpha.
  auto all = stats::ExactSequentialBoundaries({{0.3, 18}, {0.7, 40}, {1.0, 62}}, 0.05, stats::Spending::kOBrienFleming);
  for (size_t k = 0; k < 3; ++k) {
    INFO("look " << k + 1);
    CHECK(looks[k].lower == all[k].lower);
    CHECK_THAT(looks[k].alpha_spent, WithinRel(all[k].alpha_spent, 1e-12));
  }
  CHECK_THAT(stats::EnumeratedTypeIError(all), WithinRel(looks[2].alpha_spent, 1e-9));
  CHECK(looks[2].alpha_spent <= 0.05);
  // Not a re-computation as if a look had not happened: without the
  // unplanned look 2 (which could stop, so it spent alpha) the final look
  // would count a different exact type I error.
  REQUIRE(looks[1].lower >= 0);
  auto without = stats::ExactSequentialBoundaries({{0.3, 18}, {1.0, 62}}, 0.05, stats::Spending::kOBrienFleming);
  CHECK(without[1].alpha_spent != looks[2].alpha_spent);
  CHECK(looks[2].alpha_spent - looks[1].alpha_spent == Approx(all[2].alpha_here).epsilon(1e-12));

  // Each look is one sealed audit entry whose summary verify rebuilds.
  auto verify = RunCli({"--study", s.study, "verify"}, {LookedStudy::Now(22)});
  INFO(verify.out << verify.err);
  CHECK(verify.exit_code == 0);
  auto store = Store::Open(s.study + "/study.db", false);
  REQUIRE(store.ok());
  Stmt q = store.value()->Prepare("SELECT summary FROM audit WHERE command = 'monitor' ORDER BY seq");
  REQUIRE(q.Step());
  CHECK(q.Text(0) == "monitor look 1 (planned) at 120 of 400 sets: 10 reference only, 8 other only, " +
                         std::string(looks[0].lower >= 0 ? "stop at " + std::to_string(18 - looks[0].lower) + " of 18"
                                                         : "cannot stop") +
                         ", alpha spent " + [&] {
                           char b[40];
                           std::snprintf(b, sizeof b, "%.6g", looks[0].alpha_spent);
                           return std::string(b);
                         }() + ": continue");
}

TEST_CASE("monitor looks: a look whose stored row was altered fails verify") {
  LookedStudy s;
  s.Import(0, Pattern(10, 8, 102), 2);
  REQUIRE(s.Monitor(3)["new_looks"] == 1);
  {
    auto store = Store::Open(s.study + "/study.db", false);
    REQUIRE(store.ok());
    store.value()->Exec("UPDATE monitor_look SET decision = 'stop'");
  }
  auto verify = RunCli({"--study", s.study, "verify"}, {LookedStudy::Now(4)});
  CHECK(verify.exit_code == 1);
}

TEST_CASE("monitor looks: a spending function given on the command line is a labelled deviation") {
  LookedStudy s;
  REQUIRE(RunCli({"--study", s.study, "freeze"}, {LookedStudy::Now(1)}).exit_code == 0);
  s.Import(0, Pattern(10, 8, 102), 2);
  auto j = s.Monitor(3, {"--spending", "pocock"});
  CHECK(j["spending"] == "pocock");
  CHECK(j["design_spending"] == "obf");
  CHECK(j["deviation"] == "Deviation: --spending pocock differs from the design's [analysis].spending = \"obf\"; the "
                          "looks taken with it are stored with pocock and listed as deviations.");
  auto a = RunCli({"--study", s.study, "--json", "analyze"}, {LookedStudy::Now(3)});
  INFO(a.err);
  REQUIRE(a.exit_code == 0);
  auto devs = nlohmann::json::parse(a.out)["preregistration"]["deviations"];
  bool found = false;
  for (const auto& d : devs)
    if (d["kind"] == "monitor_spending") {
      found = true;
      CHECK(d["what"] == "monitor look 1 (2027-03-03T23:59:00Z) used pocock spending; the frozen plan says obf");
    }
  CHECK(found);
}

TEST_CASE("monitor looks: after a stored early stop analyze gives the stage-wise p and the repeated interval") {
  LookedStudy s;
  s.Import(0, Pattern(30, 4, 86), 2);
  auto m = s.Monitor(3);
  REQUIRE(m["decision"] == "stop");
  // A later run adds no look after the stop: the decision stands.
  s.Import(120, Pattern(5, 5, 50), 5);
  auto again = s.Monitor(6, {"--look-now"});
  CHECK(again["new_looks"] == 0);
  CHECK(again["decision"] == "stop");
  auto a = RunCli({"--study", s.study, "--json", "analyze"}, {LookedStudy::Now(6)});
  INFO(a.err);
  REQUIRE(a.exit_code == 0);
  auto e = nlohmann::json::parse(a.out)["early_stop"];
  REQUIRE(e.is_object());
  CHECK(e["look"] == 1);
  CHECK(e["sets"] == 120);
  CHECK(e["reference_only"] == 30);
  CHECK(e["other_only"] == 4);
  // The same stage-wise p-value as monitor's adjusted p.
  CHECK_THAT(e["adjusted"]["stagewise_p"].get<double>(), WithinRel(m["adjusted_p"].get<double>(), 1e-12));
  auto text = RunCli({"--study", s.study, "analyze"}, {LookedStudy::Now(6)}).out;
  CHECK(text.find("After the early stop:\n  Monitoring stopped the study early at look 1 (120 of 400 planned sets, "
                  "taken 2027-03-03T23:59:00Z): origin=inland alone called back in 30, origin=coastal alone in 4 "
                  "discordant sets.\n") != std::string::npos);
  CHECK(text.find("  The naive p-value and interval treat the stopping look as a study of fixed size;") !=
        std::string::npos);
}
