#include <catch2/catch.hpp>

#include <cmath>
#include <cstdio>
#include <string>

#include <boost/math/distributions/binomial.hpp>

#include "stats/fisher.h"
#include "stats/power_fisher.h"
#include "stats/power_unpaired.h"
#include "stats/random.h"
#include "testing/testing.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// Every pair of outcomes, each decided by FisherTest directly.
double BruteForcePower(int n, double p1, double p2, double alpha) {
  boost::math::binomial_distribution<double> b1(n, p1), b2(n, p2);
  double power = 0;
  for (int x1 = 0; x1 <= n; ++x1)
    for (int x2 = 0; x2 <= n; ++x2)
      if (FisherTest(Table2x2{x1, n - x1, x2, n - x2}, Alternative::kTwoSided, 0.95).p.p <= alpha)
        power += boost::math::pdf(b1, x1) * boost::math::pdf(b2, x2);
  return power;
}

}  // namespace

TEST_CASE("power fisher: equals brute force over every pair of outcomes") {
  for (int n : {1, 4, 11, 25})
    for (auto [p1, p2] : {std::pair{0.5, 0.15}, {0.1, 0.07}, {0.3, 0.3}, {0.02, 0.4}}) {
      INFO("n = " << n << ", p1 = " << p1 << ", p2 = " << p2);
      CHECK_THAT(FisherExactPower(n, p1, p2, 0.05), WithinAbs(BruteForcePower(n, p1, p2, 0.05), 1e-13));
    }
}

TEST_CASE("power fisher: cutoffs carried from total to total match brute force at n = 120") {
  // The region search starts each total from its neighbour's cutoffs; every
  // one of the 121^2 tables decided directly must agree.
  CHECK_THAT(FisherExactPower(120, 0.35, 0.2, 0.05), WithinAbs(BruteForcePower(120, 0.35, 0.2, 0.05), 1e-13));
  CHECK_THAT(FisherExactPower(120, 0.05, 0.12, 0.01), WithinAbs(BruteForcePower(120, 0.05, 0.12, 0.01), 1e-13));
}

TEST_CASE("power fisher: agrees with R's fisher.test enumerated live") {
  // tests/reference/power/fisher_exact_power.R: the same sum with R's
  // fisher.test deciding each of the (n + 1)^2 tables.
  std::string cmd = "Rscript '" + twinprobe::testing::SourceDir() +
                    "/tests/reference/power/fisher_exact_power.R' 20 0.5 0.15 0.05 2>&1";
  FILE* pipe = popen(cmd.c_str(), "r");
  REQUIRE(pipe != nullptr);
  double r = -1;
  REQUIRE(fscanf(pipe, "%lf", &r) == 1);
  REQUIRE(pclose(pipe) == 0);
  CHECK_THAT(FisherExactPower(20, 0.5, 0.15, 0.05), WithinRel(r, 1e-12));
}

TEST_CASE("power fisher: Fisher's test is conservative, its size stays below alpha") {
  for (int n : {10, 50, 200})
    for (double p : {0.05, 0.3}) CHECK(FisherExactPower(n, p, p, 0.05) <= 0.05);
}

TEST_CASE("power fisher: a seeded Monte Carlo simulation confirms the exact power") {
  // 4,000 simulated studies of 60 vacancies per arm at 30% vs 10%, each
  // analysed with FisherTest. Tolerance: 4 standard errors (about 0.03).
  const int n = 60, reps = 4000;
  Rng rng(77);
  int rejections = 0;
  for (int r = 0; r < reps; ++r) {
    int x1 = 0, x2 = 0;
    for (int i = 0; i < n; ++i) x1 += rng.Bernoulli(0.3), x2 += rng.Bernoulli(0.1);
    if (FisherTest(Table2x2{x1, n - x1, x2, n - x2}, Alternative::kTwoSided, 0.95).p.p <= 0.05) ++rejections;
  }
  const double simulated = static_cast<double>(rejections) / reps, exact = FisherExactPower(n, 0.3, 0.1, 0.05);
  INFO("exact " << exact << ", simulated " << simulated);
  CHECK(std::fabs(simulated - exact) < 4 * std::sqrt(exact * (1 - exact) / reps));
}

TEST_CASE("power fisher: exact power sits below the normal approximation at audit scale") {
  // Fisher's test is conservative: at 10% vs 7% and 1,356 per arm (the
  // normal approximation's 80%), its exact power is lower.
  const double exact = FisherExactPower(1356, 0.10, 0.07, 0.05);
  CHECK(exact < NormalTwoProportionPower(1356, 0.10, 0.07, 0.05));
  CHECK(exact > 0.7);
}

TEST_CASE("power fisher: the sample size reaches the target and the one below does not") {
  auto s = FisherExactSampleSize(0.5, 0.2, 0.05, 0.8);
  REQUIRE(s.found);
  CHECK(FisherExactPower(s.n, 0.5, 0.2, 0.05) >= 0.8);
  CHECK(FisherExactPower(s.n - 1, 0.5, 0.2, 0.05) < 0.8);
  CHECK(s.n_first <= s.n);
  CHECK(s.checked_from <= s.n - 5);
  CHECK(s.checked_to >= s.n + 5);
  // Larger than the normal approximation's answer (Fisher is conservative).
  CHECK(static_cast<double>(s.n) > NormalTwoProportionSampleSize(0.5, 0.2, 0.05, 0.8));
}
