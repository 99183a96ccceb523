// Power for sets designs (stats/power_sets.h): the exact sum over outcome
// patterns against simulation within 4 standard errors, the simulation
// against studies analysed with the real Cochran's Q, and the pairwise
// power against the exact McNemar power it reduces to.
#include <catch2/catch.hpp>

#include <cmath>

#include "stats/cochran_q.h"
#include "stats/power_paired.h"
#include "stats/power_sets.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("power sets: exact enumeration agrees with simulation within 4 standard errors") {
  for (auto [n, rates] : {std::pair<int64_t, std::vector<double>>{12, {0.2, 0.5, 0.6}},
                          std::pair<int64_t, std::vector<double>>{16, {0.15, 0.3, 0.45}},
                          std::pair<int64_t, std::vector<double>>{6, {0.3, 0.5, 0.7, 0.2}}}) {
    REQUIRE(stats::SetsCompositions(n, static_cast<int>(rates.size())) <= stats::kMaxSetsCompositions);
    const double exact = stats::ExactCochranPower(n, rates, 0.05);
    const int reps = 40000;
    const double simulated = stats::SimulatedCochranPower(n, rates, 0.05, 17, reps);
    const double se = std::sqrt(exact * (1 - exact) / reps);
    INFO("N " << n << " exact " << exact << " simulated " << simulated);
    CHECK_THAT(simulated, WithinAbs(exact, 4 * se));
  }
}

TEST_CASE("power sets: simulated power matches studies analysed with CochranQTest within 4 standard errors") {
  // An independent simulation: draw each probe, run the real test, count
  // p < alpha.
  const std::vector<double> rates = {0.15, 0.10, 0.07};
  const int64_t n = 400;
  const int reps = 3000;
  stats::Rng rng(99);
  int rejected = 0;
  for (int rep = 0; rep < reps; ++rep) {
    std::vector<std::vector<int>> sets;
    for (int64_t v = 0; v < n; ++v) {
      std::vector<int> row;
      for (double r : rates) row.push_back(rng.Bernoulli(r) ? 1 : 0);
      sets.push_back(row);
    }
    rejected += stats::CochranQTest(sets, false).p_asymptotic < 0.05;
  }
  const double direct = static_cast<double>(rejected) / reps;
  const auto s = stats::PowerForSets(n, rates, 0.05, 5, 20000);
  CHECK_FALSE(s.overall_exact);
  CHECK(s.replicates == 20000);
  const double se = std::sqrt(direct * (1 - direct) / reps + s.overall_se * s.overall_se);
  INFO("direct " << direct << " PowerForSets " << s.overall);
  CHECK_THAT(s.overall, WithinAbs(direct, 4 * se));
}

TEST_CASE("power sets: the smallest pairwise gap is tested by exact McNemar at alpha over the pairs") {
  const std::vector<double> rates = {0.12, 0.09, 0.07};
  const auto s = stats::PowerForSets(500, rates, 0.05, 1, 2000);
  CHECK(s.pair_first == 1);
  CHECK(s.pair_second == 2);  // 0.09 vs 0.07: the smallest gap
  CHECK_THAT(s.alpha_pairwise, WithinRel(0.05 / 3, 1e-15));
  CHECK_THAT(s.pairwise,
             WithinRel(stats::McNemarExactPower(500, {0.09 * 0.93, 0.07 * 0.91}, 0.05 / 3), 1e-14));
}

TEST_CASE("power sets: sample size reaches the target and one vacancy fewer does not") {
  const std::vector<double> rates = {0.30, 0.15, 0.10};
  const auto size = stats::SampleSizeForSets(rates, 0.05, 0.8, 7, 2000);
  REQUIRE(size.overall_found);
  REQUIRE(size.pairwise_found);
  CHECK(stats::SimulatedCochranPower(size.overall, rates, 0.05, 7, 2000) >= 0.8);
  CHECK(stats::SimulatedCochranPower(size.overall - 1, rates, 0.05, 7, 2000) < 0.8);
  const auto g = stats::SmallestPairwiseGap(rates);
  CHECK(size.pairwise == stats::McNemarExactSampleSize(g.alt, 0.05 / 3, 0.8).n_stable);
}
