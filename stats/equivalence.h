#pragma once
// Equivalence of the two arms' callback rates in a paired design: does the
// paired difference delta = p1 - p2 = (b - c) / n lie inside a margin stated
// in advance? (a, b, c, d as in stats/mcnemar.h.)
#include <cstdint>

#include "stats/binomial.h"
#include "stats/mcnemar.h"
#include "stats/paired.h"

namespace twinprobe::stats {

// Tango's score statistic (Tango 1998, "Equivalence test and confidence
// interval for the difference in proportions for the paired-sample design",
// Stat Med 17:891-908; Nam 1997, Biometrics 53:1422-1430) for H0: delta =
// delta0:
//   T(delta0) = (b - c - n delta0) / sqrt(n (2 q + delta0 (1 - delta0))),
// q the restricted maximum-likelihood estimate of the probability of c-type
// pairs under delta0: q = (sqrt(B^2 - 8 n C) - B) / (4 n),
// B = -b - c + (2n - b + c) delta0, C = -c delta0 (1 - delta0).
// T falls as delta0 rises; T = 0 when its numerator is 0.
// Requires n > 0, -1 < delta0 < 1.
double TangoScore(const PairedCounts& t, double delta0);

// Tango's score interval: the delta0 with T(delta0) = z (lower) and -z
// (upper), z = qnorm(1 - (1 - conf)/2); the lower limit is -1 when b - c =
// -n and the upper 1 when b - c = n. n = 0 gives NaN.
Estimate TangoInterval(const PairedCounts& t, double conf);

// Two one-sided tests (Schuirmann 1987, J Pharmacokinet Biopharm
// 15:657-680) of H0: delta <= lower_margin or delta >= upper_margin against
// equivalence, lower_margin < delta < upper_margin, each with Tango's score
// statistic, as Liu, Hsueh, Hsieh & Chen (2002), "Tests for equivalence or
// non-inferiority for paired binary data", Stat Med 21:231-245 (their
// RMLE-based test, without continuity correction):
//   p_lower = 1 - Phi(T(lower_margin)),  p_upper = Phi(T(upper_margin)),
//   p = max(p_lower, p_upper).
// Equivalence is shown at level alpha when p < alpha, which is the same as
// the Tango interval at conf = 1 - 2 alpha lying inside the margins.
struct EquivalenceResult {
  double estimate = 0;  // (b - c) / n
  double lower_margin = 0, upper_margin = 0;
  double z_lower = 0, z_upper = 0;  // T(lower_margin), T(upper_margin)
  PValue p_lower, p_upper, p;
  Interval ci;  // Tango's interval at conf = 1 - 2 alpha
  double alpha = 0.05;
  bool equivalent = false;
};

// Requires n > 0, -1 < lower_margin < upper_margin < 1, 0 < alpha < 0.5.
EquivalenceResult PairedEquivalence(const PairedCounts& t, double lower_margin, double upper_margin, double alpha);

}  // namespace twinprobe::stats
