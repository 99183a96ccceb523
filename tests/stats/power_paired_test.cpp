#include <catch2/catch.hpp>

#include <boost/math/distributions/binomial.hpp>

#include <cmath>
#include <cstdio>
#include <string>

#include "stats/mcnemar.h"
#include "stats/power_paired.h"
#include "stats/random.h"
#include "testing/testing.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// Runs the R reference (tests/reference/power/mcnemar_exact_power.R) and
// returns what it prints. R (r-base-core) is a test dependency (scripts/setup).
std::string RunR(const std::string& args) {
  std::string cmd = "Rscript '" + twinprobe::testing::SourceDir() + "/tests/reference/power/mcnemar_exact_power.R' " +
                    args + " 2>&1";
  std::string out;
  FILE* pipe = popen(cmd.c_str(), "r");
  REQUIRE(pipe != nullptr);
  char buf[256];
  while (fgets(buf, sizeof buf, pipe)) out += buf;
  REQUIRE(pclose(pipe) == 0);
  return out;
}

// Brute force over every table of N sets: P(b, c) is multinomial with cells
// p10, p01 and 1 - p10 - p01; add it when the exact McNemar test rejects.
double EnumeratedPower(int n, double p10, double p01, double alpha) {
  double power = 0;
  const double rest = 1 - p10 - p01;
  for (int b = 0; b <= n; ++b)
    for (int c = 0; b + c <= n; ++c) {
      if (McNemarExactP(PairedCounts{0, b, c, n - b - c}) > alpha) continue;
      if (rest == 0 && b + c < n) continue;  // impossible table when every set is discordant
      double log_p = std::lgamma(n + 1.0) - std::lgamma(b + 1.0) - std::lgamma(c + 1.0) - std::lgamma(n - b - c + 1.0) +
                     b * std::log(p10) + c * std::log(p01) + (b + c < n ? (n - b - c) * std::log(rest) : 0.0);
      power += std::exp(log_p);
    }
  return power;
}

}  // namespace

TEST_CASE("power paired: Connor (1987) worked example gives n = 22.8, rounded up to 23") {
  // Connor (1987), Biometrics 43(1):207-211, p. 209: p01 = 0.45, p10 = 0.05,
  // one-sided alpha = 0.05, power 0.90 -> n = 22.8 -> 23 (as quoted by the
  // online McNemar sample-size calculators; R 4.2.2 with Connor's formula: 22.809).
  PairedAlternative alt{0.05, 0.45};
  double n = ConnorSampleSize(alt, 0.05, 0.90, 1);
  CHECK_THAT(n, WithinAbs(22.8, 0.05));
  CHECK(std::ceil(n) == 23);
  CHECK_THAT(ConnorPower(n, alt, 0.05, 1), WithinRel(0.90, 1e-12));
  // Two-sided alpha = 0.05, power 0.80: 23 as well (zarathucorp
  // open-powersamplesize McNemar 2-sided page, R code `ceiling(n) # 23`);
  // unrounded 22.011 (R 4.2.2 with Connor's formula written out: 22.01132).
  double n2 = ConnorSampleSize(alt, 0.05, 0.80, 2);
  CHECK_THAT(n2, WithinAbs(22.011, 0.001));
  CHECK(std::ceil(n2) == 23);
}

TEST_CASE("power paired: Miettinen (1968) on Connor's example and audit-scale check values") {
  // R 4.2.2 with Connor's (1987, p. 209) and Miettinen's formulas written out: Connor's
  // example -> Miettinen 23.33; (p10, p01) = (0.05, 0.02), two-sided 0.05,
  // power 0.80 -> Connor 608.1, Miettinen 608.7; (0.06, 0.03) -> Connor 782.5;
  // (0.04, 0.02) -> Connor 1,175.
  CHECK_THAT(MiettinenSampleSize({0.05, 0.45}, 0.05, 0.90, 1), WithinAbs(23.33, 0.005));
  CHECK_THAT(ConnorSampleSize({0.05, 0.02}, 0.05, 0.80), WithinAbs(608.1, 0.05));
  CHECK_THAT(MiettinenSampleSize({0.05, 0.02}, 0.05, 0.80), WithinAbs(608.7, 0.05));
  CHECK_THAT(ConnorSampleSize({0.06, 0.03}, 0.05, 0.80), WithinAbs(782.5, 0.05));
  CHECK(std::round(ConnorSampleSize({0.04, 0.02}, 0.05, 0.80)) == 1175);
  // Power inverts the sample size (two-sided power adds the far tail, about
  // 1e-6 here, which the sample-size formula leaves out).
  double n = MiettinenSampleSize({0.05, 0.02}, 0.05, 0.80);
  CHECK_THAT(MiettinenPower(n, {0.05, 0.02}, 0.05), WithinAbs(0.80, 1e-5));
}

TEST_CASE("power paired: exact power matches the R enumeration at audit-scale sizes") {
  // R 4.2.2 enumeration (dbinom over discordant counts, exact McNemar
  // rejection region): exact conditional McNemar power at (0.05, 0.02):
  // N = 500 -> 0.672, 608 -> 0.773, 700 -> 0.835.
  PairedAlternative alt{0.05, 0.02};
  CHECK_THAT(McNemarExactPower(500, alt, 0.05), WithinAbs(0.672, 0.0005));
  CHECK_THAT(McNemarExactPower(608, alt, 0.05), WithinAbs(0.773, 0.0005));
  CHECK_THAT(McNemarExactPower(700, alt, 0.05), WithinAbs(0.835, 0.0005));
  // Live: the vectorised R enumeration (full sum, R's pbinom/qbinom/dbinom).
  for (const char* args : {"power 608 0.05 0.02 0.05", "power 10000 0.05 0.04 0.05", "power 37 0.3 0.1 0.01",
                           "power 250 0.2 0.15 0.05"}) {
    INFO(args);
    std::string a = args;
    double n, p10, p01, alpha;
    REQUIRE(std::sscanf(a.c_str(), "power %lf %lf %lf %lf", &n, &p10, &p01, &alpha) == 4);
    double r = std::stod(RunR(a));
    CHECK_THAT(McNemarExactPower(static_cast<int64_t>(n), {p10, p01}, alpha), WithinRel(r, 1e-9));
  }
}

TEST_CASE("power paired: exact power equals brute-force enumeration of every table, N <= 40") {
  for (int n : {1, 2, 5, 12, 25, 40})
    for (auto [p10, p01] : {std::pair{0.3, 0.1}, {0.05, 0.02}, {0.5, 0.5}, {0.2, 0.2}}) {
      INFO("N = " << n << ", p10 = " << p10 << ", p01 = " << p01);
      CHECK_THAT(McNemarExactPower(n, {p10, p01}, 0.05), WithinAbs(EnumeratedPower(n, p10, p01, 0.05), 1e-13));
    }
}

TEST_CASE("power paired: under no difference the exact power is the test's size, never above alpha") {
  for (int n : {10, 50, 200, 1000}) {
    double size = McNemarExactPower(n, {0.1, 0.1}, 0.05);
    CHECK(size <= 0.05);
    CHECK(size > 0.0);
  }
}

TEST_CASE("power paired: a seeded Monte Carlo simulation confirms the exact power") {
  // 20,000 simulated studies of N = 150 sets at p10 = 0.12, p01 = 0.05, each
  // analysed with the real McNemarExactP. Tolerance: 4 standard errors of a
  // proportion from 20,000 draws (about 0.014 at power 0.5).
  const int n = 150, reps = 20000;
  const double p10 = 0.12, p01 = 0.05, alpha = 0.05;
  Rng rng(20270301);
  int rejections = 0;
  for (int r = 0; r < reps; ++r) {
    PairedCounts t;
    for (int i = 0; i < n; ++i) {
      double u = rng.Uniform();
      if (u < p10) ++t.b;
      else if (u < p10 + p01) ++t.c;
      else ++t.d;
    }
    if (McNemarExactP(t) <= alpha) ++rejections;
  }
  double simulated = static_cast<double>(rejections) / reps;
  double exact = McNemarExactPower(n, {p10, p01}, alpha);
  double se = std::sqrt(exact * (1 - exact) / reps);
  INFO("exact " << exact << ", simulated " << simulated);
  CHECK(std::fabs(simulated - exact) < 4 * se);
}

TEST_CASE("power paired: the rejection bound is where the exact McNemar p first exceeds alpha") {
  for (int nd = 0; nd <= 60; ++nd) {
    int64_t k = McNemarRejectionBound(nd, 0.05);
    int64_t expected = -1;
    for (int b = 0; 2 * b < nd; ++b)
      if (McNemarExactP(PairedCounts{0, b, nd - b, 0}) <= 0.05) expected = b;
    CHECK(k == expected);
  }
  CHECK(McNemarRejectionBound(5, 0.05) == -1);  // 2 / 32 = 0.0625 > 0.05: five sets can never reject
  CHECK(McNemarRejectionBound(6, 0.05) == 0);   // 2 / 64 = 0.03125
}

TEST_CASE("power paired: smallest N for 80% power at p10 = 0.05, p01 = 0.02 is 645 (R agrees)") {
  auto s = McNemarExactSampleSize({0.05, 0.02}, 0.05, 0.80);
  REQUIRE(s.found);
  CHECK(s.n_first == 645);
  CHECK(s.n_stable == 645);
  CHECK(s.horizon == 1290);
  CHECK(s.power_first >= 0.80);
  CHECK(McNemarExactPower(644, {0.05, 0.02}, 0.05) < 0.80);
  CHECK(RunR("search 0.05 0.02 0.05 0.8 1290") == "645 645 \n");
}

TEST_CASE("power paired: where exact power dips, the stable N differs from the first N") {
  // With every set discordant (p10 + p01 = 1) the saw-tooth of the exact test
  // shows: R's full scan to N = 600 gives first 49, stable 54.
  PairedAlternative alt{0.7, 0.3};
  auto s = McNemarExactSampleSize(alt, 0.05, 0.80);
  REQUIRE(s.found);
  CHECK(s.n_first == 49);
  CHECK(s.n_stable == 54);
  CHECK(RunR("search 0.7 0.3 0.05 0.8 600") == "49 54 \n");
  // And by the definition, scanning directly.
  for (int64_t n = 1; n < s.n_first; ++n) CHECK(McNemarExactPower(n, alt, 0.05) < 0.80);
  CHECK(McNemarExactPower(s.n_stable - 1, alt, 0.05) < 0.80);
  for (int64_t n = s.n_stable; n <= s.horizon; ++n) CHECK(McNemarExactPower(n, alt, 0.05) >= 0.80);
}

TEST_CASE("power paired: losses scale the discordant share, as a mixture over completed sets confirms") {
  // Planned N sets, each lost with probability 0.2: power equals the mixture
  // over the number of completed sets m ~ Binomial(N, 0.8) of power(m).
  const int n = 120;
  const double lost = 0.2;
  PairedAlternative alt{0.15, 0.05};
  double mixture = 0;
  for (int m = 0; m <= n; ++m) {
    double w = std::exp(std::lgamma(n + 1.0) - std::lgamma(m + 1.0) - std::lgamma(n - m + 1.0) +
                        m * std::log(1 - lost) + (n - m) * std::log(lost));
    mixture += w * McNemarExactPower(m, alt, 0.05);
  }
  CHECK_THAT(McNemarExactPower(n, WithLosses(alt, lost), 0.05), WithinAbs(mixture, 1e-12));
}

TEST_CASE("power paired: practitioner's rates give the discordant probabilities") {
  // Reference called back at 10%, the other arm at 7%, both at 5%:
  // only-reference = 0.05, only-other = 0.02.
  PairedAlternative alt = AlternativeFromRates(0.10, 0.07, 0.05);
  CHECK_THAT(alt.p10, WithinAbs(0.05, 1e-15));
  CHECK_THAT(alt.p01, WithinAbs(0.02, 1e-15));
}

TEST_CASE("power paired: the minimum detectable ratio reaches the target and a smaller one does not") {
  const int64_t n = 600;
  const double rate = 0.10, both = 0.05;
  double q = McNemarDetectableRatio(n, rate, both, 0.05, 0.80);
  REQUIRE(q > 1.0);
  CHECK(McNemarExactPower(n, AlternativeFromRates(rate, rate / q, both), 0.05) >= 0.80);
  CHECK(McNemarExactPower(n, AlternativeFromRates(rate, rate / (q * 0.999), both), 0.05) < 0.80);
  // 645 sets reach 80% at 10% vs 7% (above), so 600 need a larger ratio than 10/7.
  CHECK(q > 0.10 / 0.07);
  // A budget too small for any gap allowed by `both`.
  CHECK(McNemarDetectableRatio(5, rate, both, 0.05, 0.80) == 0.0);

  double d = McNemarDetectableDifference(n, 0.07, 0.05, 0.80);
  CHECK(McNemarExactPower(n, {(0.07 + d) / 2, (0.07 - d) / 2}, 0.05) >= 0.80);
  CHECK(McNemarExactPower(n, {(0.07 + d * 0.999) / 2, (0.07 - d * 0.999) / 2}, 0.05) < 0.80);
}

TEST_CASE("power paired: the fast walk over discordant counts equals the direct computation") {
  // McNemarExactPower walks nd with pmf/cdf recurrences re-anchored every 64
  // steps; here the same sum is formed from McNemarConditionalPower (incomplete
  // beta at every nd) with Boost's binomial pmf as the weights.
  for (double alpha : {0.05, 0.01, 1e-4})
    for (double pi : {0.02, 0.3, 0.5, 0.52, 0.714, 0.97, 1.0})
      for (int n : {7, 60, 333, 2500}) {
        const double psi = 0.4;
        double direct = 0;
        for (int nd = 0; nd <= n; ++nd) {
          direct += boost::math::pdf(boost::math::binomial_distribution<double>(n, psi), nd) *
                    McNemarConditionalPower(nd, pi, alpha);
        }
        INFO("alpha " << alpha << ", pi " << pi << ", N " << n);
        CHECK_THAT(McNemarExactPower(n, {psi * pi, psi * (1 - pi)}, alpha), WithinAbs(direct, 1e-13));
        McNemarPowerCalculator calc({psi * pi, psi * (1 - pi)}, alpha);
        CHECK_THAT(calc.Power(n), WithinAbs(direct, 1e-13));
      }
}
