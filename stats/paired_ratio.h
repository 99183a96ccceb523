#pragma once
// The callback-rate ratio of a paired table, p1 / p2 = (a + b) / (a + c)
// (reference arm's callback rate over the other arm's; a, b, c, d as in
// stats/mcnemar.h), with a paired interval.
#include "stats/binomial.h"
#include "stats/mcnemar.h"
#include "stats/paired.h"

namespace twinprobe::stats {

// Bonett & Price (2006), "Confidence intervals for a ratio of binomial
// proportions based on paired data", Stat Med 25:3039-3047: the hybrid
// Wilson score interval. With n* = a + b + c, n1 = a + b, n2 = a + c,
//   A = sqrt((b + c + 2) / ((n1 + 1)(n2 + 1))),
//   B = sqrt((1 - (n1 + 1)/(n* + 2)) / (n1 + 1)),
//   C = sqrt((1 - (n2 + 1)/(n* + 2)) / (n2 + 1)),
//   z' = z A / (B + C),
// (l1, u1) and (l2, u2) the Wilson limits of n1 / n* and n2 / n* at z', the
// interval is [l1 / u2, u1 / l2]. Pairs where neither arm was called back
// (d) do not enter. Two-sided: z = qnorm(1 - (1 - conf)/2); kLess gives
// [0, u1 / l2] and kGreater [l1 / u2, inf] with z = qnorm(conf).
// Estimate (a+b)/(a+c): infinite when a + c = 0 < a + b, NaN (with the
// interval [0, inf]) when a + b + c = 0. Requires counts >= 0, 0 < conf < 1.
Estimate CallbackRatio(const PairedCounts& t, double conf, Alternative alternative = Alternative::kTwoSided);

}  // namespace twinprobe::stats
