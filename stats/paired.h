#pragma once
// Effect measures for one paired table (a = both positive, b = reference arm
// only, c = other arm only, d = neither; see stats/mcnemar.h).
#include "stats/binomial.h"
#include "stats/mcnemar.h"

namespace twinprobe::stats {

// An estimate with its interval. Infinite values are +/-infinity (never a
// large finite stand-in); an undefined estimate (0/0) is NaN.
struct Estimate {
  double estimate = 0;
  Interval ci;
};

// Conditional (matched-pairs) odds ratio b / c with its exact interval: the
// Clopper–Pearson interval (p_L, p_U) of b successes in b + c trials mapped
// through p / (1 - p) (Breslow & Day 1980, Statistical Methods in Cancer
// Research I, eq. 5.2; as exact2x2::mcnemar.exact in R). c = 0 < b gives an
// infinite estimate and upper limit; b + c = 0 gives NaN throughout.
// Requires counts >= 0, 0 < conf < 1.
Estimate ConditionalOddsRatio(const PairedCounts& t, double conf);

// Newcombe (1998), "Improved confidence intervals for the difference between
// binomial proportions based on paired data", Stat Med 17:2635-2650,
// method 10: the difference D = p1 - p2 = (b - c)/n of the positive rates
// p1 = (a+b)/n (reference) and p2 = (a+c)/n, with the interval built from
// the Wilson limits (l1, u1), (l2, u2) and the continuity-corrected phi:
// phi = C / sqrt((a+b)(c+d)(a+c)(b+d)), C = ad - bc if ad <= bc else
// max(ad - bc - n/2, 0), phi = 0 when the product is 0;
// L = D - sqrt((p1-l1)^2 - 2 phi (p1-l1)(u2-p2) + (u2-p2)^2),
// U = D + sqrt((p2-l2)^2 - 2 phi (p2-l2)(u1-p1) + (u1-p1)^2).
// n = 0 gives NaN. Requires counts >= 0, 0 < conf < 1.
Estimate NewcombePairedDifference(const PairedCounts& t, double conf);

// Net discrimination rates (ILO methodology, Bovenkerk 1992; Riach & Rich
// 2002, Economic Journal 112:F480-F518):
//   among_positive = (b - c) / (a + b + c): net share of the tests in which
//     at least one applicant was called back; its interval is Newcombe's
//     paired interval on the table (a, b, c, 0) (conditional on a + b + c);
//   over_all = (b - c) / n: the paired difference of the two callback rates,
//     with NewcombePairedDifference's interval.
struct NetDiscrimination {
  Estimate among_positive;
  Estimate over_all;
};
NetDiscrimination NetDiscriminationRates(const PairedCounts& t, double conf);

}  // namespace twinprobe::stats
