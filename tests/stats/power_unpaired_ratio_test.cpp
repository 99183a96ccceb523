// Unequal arms, one-sided and strict power for the unpaired design
// (stats/power_unpaired.h): R's power.prop.test where it covers the case
// (equal arms), the unequal-arms formula written independently in R
// (tests/reference/models/power_ratio.R), and simulation of the test.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "stats/power_unpaired.h"
#include "stats/pvalue.h"
#include "stats/r_run.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

struct Case {
  double n1, p1, p2, alpha;
  int sides;
  bool strict;
  double ratio, power;
};

const std::vector<Case> kCases = {
    {250, 0.10, 0.07, 0.05, 2, false, 1, 0.8},  {250, 0.10, 0.07, 0.05, 1, false, 1, 0.8},
    {80, 0.25, 0.20, 0.05, 2, true, 1, 0.9},    {400, 0.12, 0.07, 0.05, 2, false, 2, 0.8},
    {300, 0.12, 0.07, 0.01, 1, false, 0.5, 0.8}, {150, 0.30, 0.42, 0.05, 2, true, 3, 0.85},
    {1000, 0.05, 0.04, 0.05, 2, false, 4, 0.8}, {60, 0.5, 0.2, 0.1, 2, true, 0.25, 0.95},
};

}  // namespace

TEST_CASE("power unpaired: unequal arms, one-sided and strict agree with R") {
  std::ostringstream tsv;
  tsv.precision(17);
  tsv << "n1\tp1\tp2\talpha\tsides\tstrict\tratio\tpower\n";
  for (const auto& c : kCases)
    tsv << c.n1 << "\t" << c.p1 << "\t" << c.p2 << "\t" << c.alpha << "\t" << c.sides << "\t" << c.strict << "\t"
        << c.ratio << "\t" << c.power << "\n";
  auto r = testing::RunRScript("power_ratio.R", tsv.str());
  for (size_t i = 0; i < kCases.size(); ++i) {
    const auto& c = kCases[i];
    const std::string k = "_" + std::to_string(i);
    INFO("case " << i);
    const double power = stats::NormalTwoProportionPower(c.n1, c.p1, c.p2, c.alpha, c.sides, c.strict, c.ratio);
    CHECK_THAT(power, WithinRel(r["power" + k][0], 1e-12));  // the formula in R
    if (c.ratio == 1) CHECK_THAT(power, WithinRel(r["prop" + k][0], 1e-9));  // power.prop.test(n, p1, p2, ...)
    const double n = stats::NormalTwoProportionSampleSize(c.p1, c.p2, c.alpha, c.power, c.sides, c.strict, c.ratio);
    CHECK_THAT(n, WithinRel(r["n" + k][0], 1e-9));  // uniroot(tol = 1e-13) on the formula
  }
}

TEST_CASE("power unpaired: unequal arms agree with simulation of the pooled z test within 4 standard errors") {
  // 20,000 simulated studies per case: the pooled two-proportion z test at
  // alpha, two-sided; the normal formula is an approximation of its power.
  stats::Rng rng(20261202);
  for (const auto& c : {kCases[3], kCases[4], kCases[5]}) {
    const int64_t n1 = static_cast<int64_t>(c.n1), n2 = static_cast<int64_t>(std::llround(c.ratio * c.n1));
    const double z = stats::NormalQuantile(1 - c.alpha / c.sides);
    const int reps = 20000;
    int rejected = 0;
    for (int rep = 0; rep < reps; ++rep) {
      int64_t x1 = 0, x2 = 0;
      for (int64_t i = 0; i < n1; ++i) x1 += rng.Bernoulli(c.p1);
      for (int64_t i = 0; i < n2; ++i) x2 += rng.Bernoulli(c.p2);
      const double pbar = static_cast<double>(x1 + x2) / static_cast<double>(n1 + n2);
      const double se = std::sqrt(pbar * (1 - pbar) * (1.0 / n1 + 1.0 / n2));
      if (se == 0) continue;
      const double stat = (static_cast<double>(x1) / n1 - static_cast<double>(x2) / n2) / se;
      // One-sided plans test in the direction of the gap (p1 > p2 here).
      rejected += c.sides == 2 ? std::abs(stat) > z : stat > z;
    }
    const double simulated = static_cast<double>(rejected) / reps;
    const double se = std::sqrt(simulated * (1 - simulated) / reps);
    const double formula = stats::NormalTwoProportionPower(c.n1, c.p1, c.p2, c.alpha, c.sides, c.strict, c.ratio);
    INFO("n1 " << n1 << " n2 " << n2 << " simulated " << simulated << " formula " << formula);
    CHECK_THAT(formula, WithinAbs(simulated, 4 * se));
  }
}
