#pragma once
// Mid-p intervals for a binomial proportion and for the conditional
// (matched-pairs) odds ratio b / c.
#include <cstdint>

#include "stats/binomial.h"
#include "stats/paired.h"
#include "stats/paired_discordant.h"

namespace twinprobe::stats {

// The mid-p interval for a binomial proportion (Lancaster 1961, JASA
// 56:223-234; Berry & Armitage 1995, The Statistician 44:417-423): the
// Clopper–Pearson equations with half the probability of the observed value,
//   lower p_L:  P(X > x; p_L) + P(X = x; p_L) / 2 = alpha   (0 when x = 0),
//   upper p_U:  P(X < x; p_U) + P(X = x; p_U) / 2 = alpha   (1 when x = n),
// alpha = (1 - conf)/2 two-sided, 1 - conf for the one-sided bound
// (kLess: [0, p_U], kGreater: [p_L, 1]). Solved to ~1e-14 relative.
// Requires 0 <= x <= n, n > 0, 0 < conf < 1.
Interval MidPBinomialInterval(int64_t x, int64_t n, double conf, Alternative alternative = Alternative::kTwoSided);

// The conditional odds ratio b / c with the mid-p interval of b successes in
// b + c trials mapped through p / (1 - p) (the transformed mid-p interval of
// Fagerland, Lydersen & Laake 2017, Statistical Analysis of Contingency
// Tables, chapter 8; the exact version is ConditionalOddsRatio in
// stats/paired.h). b + c = 0 gives NaN throughout; c = 0 < b an infinite
// estimate and upper limit. Requires counts >= 0, 0 < conf < 1.
Estimate ConditionalOddsRatioMidP(const DiscordantCounts& t, double conf,
                                  Alternative alternative = Alternative::kTwoSided);

}  // namespace twinprobe::stats
