#pragma once
// A p-value that stays meaningful below the smallest double.
//
// Exact tail sums are computed in log space, so when the probability is too
// small for a double (below about 4.9e-324) `p` is 0 but `log10_p` still holds
// its base-10 logarithm (e.g. -412.7). Reports print "p < 1e-300 (log10 p =
// -412.7)" instead of a bare 0. For ordinary values log10_p == log10(p).
#include <cmath>

namespace twinprobe::stats {

struct PValue {
  double p = 1;        // in [0, 1]
  double log10_p = 0;  // finite unless p is exactly 0 by construction (never here)

  // From the natural log of a probability (clamped to <= 0).
  static PValue FromLog(double log_p);
  static PValue FromValue(double p);  // p in [0, 1], p > 0 or an exact 0
  // True when p underflowed and only log10_p carries the value.
  bool underflowed() const { return p == 0 && std::isfinite(log10_p); }
};

// log(exp(x) + exp(y)) without overflow; either may be -inf.
double LogAddExp(double x, double y);

// Upper tail of the chi-square distribution with `df` degrees of freedom,
// P(X >= statistic), as a PValue (log space far in the tail: an asymptotic
// series of the incomplete gamma function, Abramowitz & Stegun 6.5.32, when
// the direct value underflows). Matches R's pchisq(x, df, lower.tail = FALSE).
// Requires df > 0, statistic >= 0 (NaN statistic gives p = NaN).
PValue ChiSquareUpper(double statistic, double df);

// Standard normal quantile z_q, i.e. R's qnorm(q). Requires 0 < q < 1.
double NormalQuantile(double q);

}  // namespace twinprobe::stats
