// Zeros, empty discordance, all-equal tables, infinite estimates, counts up
// to 10^7 and p-values below the smallest double.
#include <catch2/catch.hpp>

#include <cmath>

#include "stats/adjust.h"
#include "stats/binomial.h"
#include "stats/exact_stratified.h"
#include "stats/fisher.h"
#include "stats/mcnemar.h"
#include "stats/paired.h"
#include "stats/stratified.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinRel;

TEST_CASE("edge: no discordant pairs gives p = 1 and an undefined odds ratio") {
  PairedCounts t{10, 0, 0, 30};
  McNemarResult r = McNemar(t);
  CHECK(r.exact.p == 1.0);
  CHECK(r.mid_p.p == 1.0);
  CHECK(std::isnan(r.chi2));  // R: NaN (0/0)
  CHECK(std::isnan(ConditionalOddsRatio(t, 0.95).estimate));
  CHECK(NetDiscriminationRates(t, 0.95).over_all.estimate == 0.0);
}

TEST_CASE("edge: only reference-favoured pairs give an infinite odds ratio, not a large number") {
  Estimate e = ConditionalOddsRatio({5, 12, 0, 40}, 0.95);
  CHECK(std::isinf(e.estimate));
  CHECK(std::isinf(e.ci.high));
  CHECK(e.ci.low > 1);
  FisherResult f = FisherTest({12, 0, 5, 9}, Alternative::kTwoSided, 0.95);
  CHECK(std::isinf(f.estimate));
  CHECK(std::isinf(f.ci.high));
  CHECK(FisherTest({0, 12, 5, 9}, Alternative::kTwoSided, 0.95).estimate == 0.0);
}

TEST_CASE("edge: a zero margin leaves the odds ratio undefined with the interval [0, inf]") {
  FisherResult f = FisherTest({0, 0, 3, 4}, Alternative::kTwoSided, 0.95);
  CHECK(f.p.p == 1.0);
  CHECK(std::isnan(f.estimate));
  CHECK(f.ci.low == 0.0);
  CHECK(std::isinf(f.ci.high));
  CHECK(std::isnan(WoolfOddsRatio({0, 0, 3, 4}, 0.95).estimate));
}

TEST_CASE("edge: a McNemar p-value below the smallest double keeps its log10") {
  // b = 0 of 5000 discordant pairs: p = 2 * 2^-5000, log10 = log10(2) - 5000 log10(2).
  McNemarResult r = McNemar({0, 0, 5000, 0});
  CHECK(r.exact.p == 0.0);
  CHECK(r.exact.underflowed());
  CHECK_THAT(r.exact.log10_p, WithinRel(std::log10(2.0) * (1 - 5000), 1e-12));
  CHECK(r.chi2_p.underflowed());
  CHECK(r.chi2_p.log10_p < -1000);
}

TEST_CASE("edge: Fisher with counts of ten million runs and keeps log10 of an underflowing p") {
  Table2x2 t{5'000'000, 5'000'000, 4'990'000, 5'010'000};
  FisherResult r = FisherTest(t, Alternative::kTwoSided, 0.95);
  CHECK(r.p.p > 0);  // z about 4.5: an ordinary small p
  CHECK(r.p.p < 1e-4);
  CHECK(r.estimate > 1.0);
  CHECK(r.ci.low < r.estimate);
  CHECK(r.ci.high > r.estimate);
  FisherResult extreme = FisherTest({10'000'000, 0, 0, 10'000'000}, Alternative::kTwoSided, 0.95);
  CHECK(extreme.p.underflowed());
  // p = 2 / C(2e7, 1e7); log10 C(2n, n) ~ 2n log10 2 - log10(sqrt(pi n)).
  const double n = 1e7;
  CHECK_THAT(extreme.p.log10_p, WithinRel(std::log10(2.0) - (2 * n * std::log10(2.0) - 0.5 * std::log10(M_PI * n)), 1e-9));
}

TEST_CASE("edge: binomial test with n = 10^7") {
  BinomTestResult r = BinomTest(5'001'000, 10'000'000, 0.5, Alternative::kTwoSided, 0.95);
  CHECK(r.p.p > 0.5);
  CHECK(r.p.p < 0.6);
  BinomTestResult far = BinomTest(0, 10'000'000, 0.5, Alternative::kTwoSided, 0.95);
  CHECK(far.p.underflowed());
  CHECK_THAT(far.p.log10_p, WithinRel(std::log10(2.0) - 1e7 * std::log10(2.0), 1e-12));
}

TEST_CASE("edge: Mantel-Haenszel with no discordant information gives NaN, not garbage") {
  MantelHaenszelResult r = MantelHaenszel({{0, 5, 0, 5}, {0, 3, 0, 4}}, 0.95);
  CHECK(std::isnan(r.estimate));
  CHECK(std::isnan(r.chi2));
  CHECK(r.strata_used == 2);
  MantelHaenszelResult inf = MantelHaenszel({{3, 0, 0, 5}, {2, 0, 1, 4}}, 0.95);
  CHECK(std::isinf(inf.estimate));
}

TEST_CASE("edge: strata with fewer than two observations are left out of Mantel-Haenszel") {
  MantelHaenszelResult with = MantelHaenszel({{3, 2, 1, 4}, {1, 0, 0, 0}, {2, 2, 2, 3}}, 0.95);
  MantelHaenszelResult without = MantelHaenszel({{3, 2, 1, 4}, {2, 2, 2, 3}}, 0.95);
  CHECK(with.strata_used == 2);
  CHECK(with.estimate == without.estimate);
  CHECK(with.chi2 == without.chi2);
}

TEST_CASE("edge: the exact stratified test refuses work beyond its budget instead of hanging") {
  CHECK_FALSE(ExactCommonOddsRatio({{5000, 5000, 5000, 5000}, {5000, 5000, 5000, 5000}}, Alternative::kTwoSided, 0.95, 1e6));
}

TEST_CASE("edge: p.adjust of one value and of none returns the input") {
  CHECK(AdjustP({0.02}, Adjustment::kHolm) == std::vector<double>{0.02});
  CHECK(AdjustP({}, Adjustment::kBH).empty());
  CHECK(AdjustP({0.01, 0.04}, Adjustment::kHommel) == AdjustP({0.01, 0.04}, Adjustment::kHochberg));
  CHECK(ParseAdjustment("BH") == Adjustment::kBH);
  CHECK_FALSE(ParseAdjustment("sidak"));
}
