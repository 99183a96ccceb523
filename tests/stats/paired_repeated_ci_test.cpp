// Repeated confidence intervals after interim looks: a single look is the
// fixed-sample exact interval, the nominal levels follow the spending
// boundaries, and the intervals cover the true odds ratio at every look
// simultaneously (exact enumeration of the walk), where naive 95% intervals
// do not.
#include <catch2/catch.hpp>

#include <cmath>

#include "stats/log_density.h"
#include "stats/paired_repeated_ci.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// P(the interval at every look covers psi) for the walk b_k with
// Binomial(n_k - n_{k-1}, psi/(1+psi)) steps; `conf[k]` is the level used at
// look k. Exact: the distribution of b_k restricted to paths that covered so
// far is carried from look to look.
double SimultaneousCoverage(const std::vector<int64_t>& n, const std::vector<double>& conf, double psi) {
  const double pi = psi / (1 + psi);
  std::vector<double> mass{1.0};  // over b = 0..n_k
  int64_t prev = 0;
  for (size_t k = 0; k < n.size(); ++k) {
    const int64_t step = n[k] - prev;
    std::vector<double> next(static_cast<size_t>(n[k]) + 1, 0.0);
    for (int64_t b = 0; b <= prev; ++b)
      for (int64_t j = 0; j <= step; ++j)
        next[static_cast<size_t>(b + j)] += mass[static_cast<size_t>(b)] * std::exp(LogDbinom(j, step, pi));
    for (int64_t b = 0; b <= n[k]; ++b) {
      const Estimate e = ConditionalOddsRatio(PairedCounts{0, b, n[k] - b, 0}, conf[k]);
      if (!(e.ci.low <= psi && psi <= e.ci.high)) next[static_cast<size_t>(b)] = 0;
    }
    mass.swap(next);
    prev = n[k];
  }
  double total = 0;
  for (double m : mass) total += m;
  return total;
}

}  // namespace

TEST_CASE("repeated CI: one final look is the fixed-sample exact interval") {
  auto r = RepeatedConfidenceIntervals({{66, 32}}, {1.0}, 0.05, Spending::kOBrienFleming);
  REQUIRE(r.size() == 1);
  const Estimate fixed = ConditionalOddsRatio(PairedCounts{0, 66, 32, 0}, 0.95);
  // The z-scale boundary is solved numerically to about 1e-6.
  CHECK_THAT(r[0].boundary_z, WithinAbs(1.959963984540054, 1e-5));
  CHECK_THAT(r[0].odds_ratio.ci.low, WithinRel(fixed.ci.low, 1e-5));
  CHECK_THAT(r[0].odds_ratio.ci.high, WithinRel(fixed.ci.high, 1e-5));
}

TEST_CASE("repeated CI: five O'Brien-Fleming looks use the tabulated boundaries' nominal levels") {
  // Two-sided alpha = 0.05, five equally spaced looks, O'Brien–Fleming-type
  // spending: 4.877, 3.357, 2.680, 2.290, 2.031 (the commonly tabulated
  // values, from memory; the boundaries themselves are checked against rpact
  // in tests/stats/sequential_test.cpp).
  const double tabulated[] = {4.877, 3.357, 2.680, 2.290, 2.031};
  auto r = RepeatedConfidenceIntervals({{8, 3}, {15, 7}, {24, 11}, {31, 15}, {40, 19}}, {0.2, 0.4, 0.6, 0.8, 1.0}, 0.05,
                                       Spending::kOBrienFleming);
  REQUIRE(r.size() == 5);
  for (size_t k = 0; k < 5; ++k) {
    CHECK_THAT(r[k].boundary_z, WithinAbs(tabulated[k], 0.002));
    CHECK_THAT(r[k].nominal_conf, WithinRel(1 - std::erfc(r[k].boundary_z / std::sqrt(2.0)), 1e-15));
  }
  // Early intervals are wider than a naive 95% interval on the same counts.
  const Estimate naive = ConditionalOddsRatio(PairedCounts{0, 8, 3, 0}, 0.95);
  CHECK(r[0].odds_ratio.ci.low < naive.ci.low);
  CHECK(r[0].odds_ratio.ci.high > naive.ci.high);
}

TEST_CASE("repeated CI: cover the odds ratio at all looks at once, where naive 95% intervals fall short") {
  const std::vector<int64_t> n{20, 40, 60, 80, 100};
  const std::vector<double> t{0.2, 0.4, 0.6, 0.8, 1.0};
  for (Spending s : {Spending::kOBrienFleming, Spending::kPocock}) {
    std::vector<DiscordantCounts> any(5, DiscordantCounts{1, 1});
    auto r = RepeatedConfidenceIntervals(any, t, 0.05, s);
    std::vector<double> conf;
    for (const auto& look : r) conf.push_back(look.nominal_conf);
    for (double psi : {1.0, 1.5, 2.5}) {
      INFO("spending " << SpendingName(s) << ", psi " << psi);
      CHECK(SimultaneousCoverage(n, conf, psi) >= 0.95);
    }
  }
  // Five naive 95% intervals cover the truth at all looks less often.
  CHECK(SimultaneousCoverage(n, std::vector<double>(5, 0.95), 1.0) < 0.95);
}
