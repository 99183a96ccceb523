// Published worked examples, with the source named beside each value. Where
// a publication prints fewer digits, the value is R 4.2.2's (the call is
// named); R outputs quoted from R's help pages are marked as such.
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
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("published: Agresti's presidential approval table, all McNemar quantities") {
  // Agresti (1990), Categorical Data Analysis, p. 350; Agresti (2002) section
  // 10.1; R's mcnemar.test help: matrix(c(794, 86, 150, 570), 2). Published:
  // X^2 = 17.36 (z = -4.17); difference 0.04 with 95% CI (0.02, 0.06).
  PairedCounts t{794, 150, 86, 570};
  McNemarResult r = McNemar(t);
  CHECK_THAT(r.chi2, WithinAbs(17.36, 0.005));
  CHECK_THAT(r.chi2_corrected, WithinRel(16.8178, 1e-5));  // R's mcnemar.test output in its help page: 16.818 (corrected)
  CHECK_THAT(r.exact.p, WithinRel(3.7159e-05, 1e-4));     // R: binom.test(86, 236)$p.value
  CHECK_THAT(r.mid_p.p, WithinRel(2.8934e-05, 1e-4));     // R: that minus dbinom(86, 236, 0.5)
  Estimate cor = ConditionalOddsRatio(t, 0.95);
  CHECK_THAT(cor.estimate, WithinRel(150.0 / 86.0, 1e-15));
  CHECK_THAT(cor.ci.low, WithinRel(1.3292, 1e-4));        // R: ci/(1-ci), ci = binom.test(150, 236)$conf.int
  CHECK_THAT(cor.ci.high, WithinRel(2.3010, 1e-4));
  Estimate d = NewcombePairedDifference(t, 0.95);
  CHECK_THAT(d.estimate, WithinRel(0.04, 1e-12));
  CHECK_THAT(d.ci.low, WithinAbs(0.02, 0.005));           // Agresti: (0.02, 0.06), Wald
  CHECK_THAT(d.ci.low, WithinRel(0.02123, 1e-3));         // Newcombe method 10, tests/reference/reference.R
  CHECK_THAT(d.ci.high, WithinRel(0.05870, 1e-3));
}

TEST_CASE("published: Newcombe's paired-difference examples") {
  // Newcombe (1998), Stat Med 17:2635-2650, example (36, 12, 2, 0):
  // D = 0.20, method 10 interval (0.0569, 0.3404) (the paper's Table II, from
  // memory; tests/reference/reference.R gives 0.05693, 0.34043).
  Estimate e = NewcombePairedDifference({36, 12, 2, 0}, 0.95);
  CHECK_THAT(e.estimate, WithinRel(0.2, 1e-12));
  CHECK_THAT(e.ci.low, WithinAbs(0.0569, 5e-5));
  CHECK_THAT(e.ci.high, WithinAbs(0.3404, 5e-5));
  // Altman et al. (2000), Statistics with Confidence, Table 6.2 layout
  // (14, 5, 0, 22): D = 0.12195, interval (0.011483, 0.226493) (tests/reference/reference.R).
  Estimate f = NewcombePairedDifference({14, 5, 0, 22}, 0.95);
  CHECK_THAT(f.ci.low, WithinRel(0.011483, 1e-4));
  CHECK_THAT(f.ci.high, WithinRel(0.226493, 1e-5));
}

TEST_CASE("published: net discrimination rates of a 40, 30, 10, 420 pair table") {
  // a=40, b=30, c=10, d=420: NDR = 0.25 with Newcombe CI (0.0987, 0.3866);
  // over all pairs 0.04 with (0.0152, 0.0660) (Newcombe method 10 on (40, 30,
  // 10, 0) and (40, 30, 10, 420), tests/reference/reference.R in R 4.2.2).
  NetDiscrimination n = NetDiscriminationRates({40, 30, 10, 420}, 0.95);
  CHECK_THAT(n.among_positive.estimate, WithinRel(0.25, 1e-12));
  CHECK_THAT(n.among_positive.ci.low, WithinAbs(0.0987, 5e-5));
  CHECK_THAT(n.among_positive.ci.high, WithinAbs(0.3866, 5e-5));
  CHECK_THAT(n.over_all.estimate, WithinRel(0.04, 1e-12));
  CHECK_THAT(n.over_all.ci.low, WithinAbs(0.0152, 5e-5));
  CHECK_THAT(n.over_all.ci.high, WithinAbs(0.0660, 5e-5));
}

TEST_CASE("published: Fisher's tea-tasting experiment") {
  // Fisher (1935), The Design of Experiments; Agresti (2002) p. 91; R's
  // fisher.test help: matrix(c(3, 1, 1, 3), 2), alternative = "greater"
  // gives p = 0.2429 (R help output). Null pmf 1/70, 16/70, 36/70, 16/70, 1/70.
  Table2x2 tea{3, 1, 1, 3};
  CHECK_THAT(FisherTest(tea, Alternative::kGreater, 0.95).p.p, WithinRel(17.0 / 70.0, 1e-13));
  FisherResult two = FisherTest(tea, Alternative::kTwoSided, 0.95);
  CHECK_THAT(two.p.p, WithinRel(34.0 / 70.0, 1e-13));
  // Conditional MLE 6.40832 and exact CI (0.21174, 626.24) (solved to full
  // precision, tests/reference/reference.R cond_tight); R prints 6.408309 and (0.2117329, 621.9337505) because its uniroot
  // stops at ~1e-4 on the 1/psi scale.
  CHECK_THAT(two.estimate, WithinRel(6.40832, 1e-5));
  CHECK_THAT(two.ci.low, WithinRel(0.21174, 1e-4));
  CHECK_THAT(two.ci.high, WithinRel(626.24, 1e-5));
}

TEST_CASE("published: Fisher's criminal twins (convictions)") {
  // Fisher (1962); R's fisher.test help: matrix(c(2, 10, 15, 3), 2),
  // alternative = "less": p = 0.0004652 (R help). R 4.2.2 fisher.test:
  // two-sided 0.00053672, MLE 0.046937, CI (0.0033172, 0.36319) (the MLE and
  // limits solved to full precision as in tests/reference/reference.R).
  Table2x2 t{2, 15, 10, 3};
  CHECK_THAT(FisherTest(t, Alternative::kLess, 0.95).p.p, WithinRel(0.00046518, 1e-4));
  FisherResult r = FisherTest(t, Alternative::kTwoSided, 0.95);
  CHECK_THAT(r.p.p, WithinRel(0.00053672, 1e-4));
  CHECK_THAT(r.estimate, WithinRel(0.046937, 1e-4));
  CHECK_THAT(r.ci.low, WithinRel(0.0033172, 1e-4));
  CHECK_THAT(r.ci.high, WithinRel(0.36319, 1e-4));
}

namespace {

std::vector<Table2x2> Penicillin() {
  // Agresti (1990), pp. 231-237; R's mantelhaen.test help "Rabbits":
  // penicillin level strata, rows Delay None / 1.5h, columns Cured / Died.
  return {{0, 6, 0, 5}, {3, 3, 0, 6}, {6, 0, 2, 4}, {5, 1, 6, 0}, {2, 0, 5, 0}};
}

}  // namespace

TEST_CASE("published: Mantel-Haenszel on the penicillin and rabbits data") {
  // R / statsmodels (TestStratified1): OR_MH = 7, X^2 (corrected) = 3.9286,
  // p = 0.04747, RBG CI (1.026713, 47.725133).
  MantelHaenszelResult r = MantelHaenszel(Penicillin(), 0.95);
  CHECK_THAT(r.estimate, WithinRel(7.0, 1e-13));
  CHECK_THAT(r.chi2_corrected, WithinRel(3.9286, 1e-4));
  CHECK_THAT(r.chi2_corrected_p.p, WithinRel(0.04747, 1e-3));
  CHECK_THAT(r.ci.low, WithinRel(1.026713, 1e-6));
  CHECK_THAT(r.ci.high, WithinRel(47.725133, 1e-7));
  // R's help: the exact conditional test gives p about 0.040, one-sided about 0.020.
  auto exact = ExactCommonOddsRatio(Penicillin(), Alternative::kTwoSided, 0.95);
  REQUIRE(exact);
  CHECK_THAT(exact->p.p, WithinAbs(0.040, 0.0005));
  auto greater = ExactCommonOddsRatio(Penicillin(), Alternative::kGreater, 0.95);
  CHECK_THAT(greater->p.p, WithinAbs(0.020, 0.0005));
}

TEST_CASE("published: Breslow-Day and Tarone on the statsmodels / DescTools example") {
  // statsmodels TestStratified2 (values derived from DescTools): OR_MH 3.5912,
  // X^2 11.8852, CI (1.781135, 7.240633), BD 1.8438 (p 0.7645), Tarone 1.8436.
  std::vector<Table2x2> s{{20, 14, 10, 24}, {15, 12, 3, 15}, {3, 2, 3, 2}, {12, 3, 7, 5}, {1, 0, 3, 2}};
  MantelHaenszelResult mh = MantelHaenszel(s, 0.95);
  CHECK_THAT(mh.estimate, WithinRel(3.5912, 1e-4));
  CHECK_THAT(mh.chi2_corrected, WithinRel(11.8852, 1e-4));  // with continuity correction, as statsmodels test_null_odds(correction=True)
  CHECK_THAT(mh.ci.low, WithinRel(1.781135, 1e-6));
  CHECK_THAT(mh.ci.high, WithinRel(7.240633, 1e-6));
  BreslowDayResult bd = BreslowDay(s);
  CHECK_THAT(bd.statistic, WithinRel(1.8438, 1e-4));
  CHECK_THAT(bd.p.p, WithinRel(0.7645, 1e-4));
  CHECK_THAT(bd.tarone, WithinRel(1.8436, 1e-4));
  CHECK(bd.df == 4);
}

TEST_CASE("published: UC Berkeley admissions by department (Breslow-Day)") {
  // statsmodels TestStratified3: OR_MH 1.101879, CI (0.9402012, 1.2913602),
  // BD 18.83297 (p 0.002064786); uncorrected CMH X^2 1.4313 (R 4.2.2
  // mantelhaen.test(correct = FALSE): 1.431306).
  std::vector<Table2x2> s{{313, 512, 19, 89}, {207, 353, 8, 17},  {205, 120, 391, 202},
                          {278, 139, 244, 131}, {138, 53, 299, 94}, {351, 22, 317, 24}};
  MantelHaenszelResult mh = MantelHaenszel(s, 0.95);
  CHECK_THAT(mh.estimate, WithinRel(1.101879, 1e-6));
  CHECK_THAT(mh.ci.low, WithinRel(0.9402012, 1e-6));
  CHECK_THAT(mh.chi2, WithinRel(1.4313, 1e-4));
  BreslowDayResult bd = BreslowDay(s);
  CHECK_THAT(bd.statistic, WithinRel(18.83297, 1e-6));
  CHECK_THAT(bd.p.p, WithinRel(0.002064786, 1e-6));
}

TEST_CASE("published: Benjamini and Hochberg's 15 p-values") {
  // Benjamini & Hochberg (1995), JRSS B 57:289-300, section 4: at q = 0.05
  // BH rejects 4 hypotheses and Bonferroni 3. Adjusted values as R's
  // p.adjust in R 4.2.2 (BH[4] = 0.035625, BY[1] = 0.004977343).
  std::vector<double> p{0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344,
                        0.0459, 0.3240, 0.4262, 0.5719, 0.6528, 0.7590, 1.000};
  auto rejections = [&](Adjustment m) {
    int k = 0;
    for (double v : AdjustP(p, m)) k += v <= 0.05;
    return k;
  };
  CHECK(rejections(Adjustment::kBH) == 4);
  CHECK(rejections(Adjustment::kBonferroni) == 3);
  CHECK(rejections(Adjustment::kHolm) == 3);
  CHECK(rejections(Adjustment::kHochberg) == 3);
  CHECK(rejections(Adjustment::kHommel) == 3);
  CHECK(rejections(Adjustment::kBY) == 3);
  auto bh = AdjustP(p, Adjustment::kBH);
  CHECK_THAT(bh[3], WithinRel(0.035625, 1e-12));
  CHECK_THAT(bh[5], WithinRel(0.063857142857142, 1e-12));
  auto hommel = AdjustP(p, Adjustment::kHommel);
  CHECK_THAT(hommel[3], WithinRel(0.095, 1e-12));
  CHECK_THAT(hommel[4], WithinRel(0.1608, 1e-12));
  auto by = AdjustP(p, Adjustment::kBY);
  CHECK_THAT(by[0], WithinRel(0.004977, 1e-3));
}

TEST_CASE("published: Conover's binomial example and Clopper-Pearson / Wilson edges") {
  // Conover (1971) p. 97 via R's binom.test help: binom.test(682, 925, p = 3/4):
  // p-value 0.3825, CI (0.7076683, 0.7654066) (R help output).
  BinomTestResult r = BinomTest(682, 925, 0.75, Alternative::kTwoSided, 0.95);
  CHECK_THAT(r.p.p, WithinRel(0.3825, 1e-3));
  CHECK_THAT(r.ci.low, WithinRel(0.7076683, 1e-6));
  // R 4.2.2 prop.test(x, n, correct = FALSE)$conf.int: Wilson (0.707996, 0.764636);
  // Wilson 0/10 upper 0.277533.
  Interval w = Wilson(682, 925, 0.95);
  CHECK_THAT(w.low, WithinRel(0.707996, 1e-5));
  CHECK_THAT(w.high, WithinRel(0.764636, 1e-5));
  CHECK(Wilson(0, 10, 0.95).low == 0.0);
  CHECK_THAT(Wilson(0, 10, 0.95).high, WithinRel(0.277533, 1e-5));
}
