// `power sets` against an independent simulation of the analysis
// (tests/reference/models/power_sets_sim.py: numpy draws, Cochran's Q from
// its definition against scipy's chi-square, exact McNemar from scipy's
// binomial, Holm's step-down written out), within 4 Monte Carlo standard
// errors: the overall test, the smallest pairwise gap at alpha / m (exact in
// `power sets`) and that gap after Holm over every pair, as `analyze`
// adjusts.
#include <catch2/catch.hpp>

#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>

#include "stats/r_run.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

struct Design {
  std::string rates;  // as --rates
  int vacancies;
};

double Combined(double a, double b) { return std::sqrt(a * a + b * b); }

}  // namespace

TEST_CASE("power sets: overall and smallest-gap power agree with a simulation of the analysis within 4 standard errors") {
  const std::vector<Design> designs = {{"0.30,0.22,0.18", 150}, {"0.30,0.22,0.18", 300}, {"0.25,0.20,0.15,0.10", 200}};
  std::ostringstream tsv;
  for (size_t i = 0; i < designs.size(); ++i) {
    std::string rates = designs[i].rates;
    for (char& c : rates)
      if (c == ',') c = ' ';
    // 20,000 simulated studies each, python's own seed per design.
    tsv << designs[i].vacancies << " 20000 " << 101 + i << " " << rates << "\n";
  }
  auto py = testing::RunPythonScript("power_sets_sim.py", tsv.str());
  for (size_t i = 0; i < designs.size(); ++i) {
    const Design& d = designs[i];
    INFO(d.rates << " with " << d.vacancies << " vacancies");
    auto r = RunCli({"--json", "power", "sets", "--rates", d.rates, "--vacancies", std::to_string(d.vacancies),
                     "--replicates", "20000"});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
    const auto j = nlohmann::json::parse(r.out);
    REQUIRE(j["overall"]["method"] == "simulation");
    const std::string n = "_" + std::to_string(i);
    const double overall = j["overall"]["power"].get<double>();
    const double overall_se = j["overall"]["standard_error"].get<double>();
    INFO("overall " << overall << " python " << py["overall" + n][0]);
    CHECK(std::abs(overall - py["overall" + n][0]) <= 4 * Combined(overall_se, py["overall" + n][1]));
    // Bonferroni power is exact in `power sets`: only python's error counts.
    const double bonferroni = j["pairwise"]["power"].get<double>();
    INFO("bonferroni " << bonferroni << " python " << py["pair_bonferroni" + n][0]);
    CHECK(std::abs(bonferroni - py["pair_bonferroni" + n][0]) <= 4 * py["pair_bonferroni" + n][1]);
    const double holm = j["pairwise"]["holm"]["power"].get<double>();
    const double holm_se = j["pairwise"]["holm"]["standard_error"].get<double>();
    INFO("holm " << holm << " python " << py["pair_holm" + n][0]);
    CHECK(std::abs(holm - py["pair_holm" + n][0]) <= 4 * Combined(holm_se, py["pair_holm" + n][1]));
    CHECK(holm >= bonferroni - 4 * holm_se);
  }
}
