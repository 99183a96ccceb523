#pragma once
// The impact ratio: one group's selection (positive) rate over the
// reference group's, x1/n1 over x2/n2, with an interval for the ratio of two
// independent proportions.
//
// Rule of thumb, never a test: the Uniform Guidelines on Employee Selection
// Procedures (1978), 29 CFR 1607.4(D), take a ratio below four-fifths (0.8)
// to the group with the highest rate as "generally" evidence of adverse
// impact and a ratio above it as generally not; `below_four_fifths` records
// that reading only, beside the interval that shows the uncertainty.
//
// Intervals:
// - Katz log (Katz, Baptista, Azen & Pike 1978, Biometrics 34:469-474):
//   exp(log(R) -+ z sqrt(1/x1 - 1/n1 + 1/x2 - 1/n2)); undefined (NaN) when
//   x1 or x2 is 0.
// - Koopman asymptotic score (Koopman 1984, Biometrics 40:513-517): the set
//   of ratios theta whose score statistic
//     (p1 - theta p2) / sqrt(q1 (1 - q1) / n1 + theta^2 q2 (1 - q2) / n2),
//   with (q1, q2) = (theta q2, q2) the maximum-likelihood rates under the
//   ratio theta (the root of a quadratic, Miettinen & Nurminen 1985, Stat
//   Med 4:213-226, without their n / (n - 1) factor), lies within -+z. Each
//   limit is solved to 1e-12 relative. Lower limit 0 when x1 = 0, upper
//   limit +inf when x2 = 0. Recommended by Fagerland, Lydersen & Laake
//   (2015), Stat Methods Med Res 24:224-254. Same as statsmodels'
//   confint_proportions_2indep(compare = "ratio", method = "score",
//   correction = False).
#include <cstdint>
#include <vector>

#include "stats/binomial.h"

namespace twinprobe::stats {

struct ImpactRatio {
  double rate = 0, reference_rate = 0;
  double ratio = 0;            // rate / reference_rate (inf or NaN when the reference rate is 0)
  Interval katz_log;           // NaN limits when a count is 0
  Interval koopman_score;      // [0, inf] limits as described above
  bool below_four_fifths = false;  // ratio < 0.8: the 29 CFR 1607.4(D) rule of thumb only
};

// Group: x1 positives of n1; reference: x2 of n2. Requires 0 <= x_i <= n_i,
// n_i >= 1, 0 < conf < 1, and x1 + x2 > 0 (with no positive at all there is no
// ratio to estimate; every field is then NaN).
ImpactRatio ImpactRatioOf(int64_t x1, int64_t n1, int64_t x2, int64_t n2, double conf);

// Every group's impact ratio against one comparison group: `reference` (an
// index), or, with kHighestRate, the group with the highest selection rate
// (the first of equals), as 29 CFR 1607.4(D) reads it. Returns one entry per
// group (the comparison group's own ratio is 1). Requires equal lengths,
// n_i >= 1, 0 <= x_i <= n_i.
inline constexpr int kHighestRate = -1;
std::vector<ImpactRatio> ImpactRatios(const std::vector<int64_t>& positives, const std::vector<int64_t>& totals,
                                      int reference, double conf);

}  // namespace twinprobe::stats
