#pragma once
// Rank tests with R's semantics (R's stats::wilcox.test, source
// src/library/stats/R/wilcox.test.R, R 4.2): the Wilcoxon signed-rank test
// for paired data (Wilcoxon 1945, Biometrics Bulletin 1(6):80-83), the
// Wilcoxon-Mann-Whitney rank-sum test for two samples (Mann & Whitney 1947,
// Ann. Math. Statist. 18(1):50-60), and the sign test.
//
// Signed rank (differences d = x - y, or a single sample d):
//   zero differences are dropped; V = sum of the ranks of |d| over d > 0
//   (average ranks for ties). Exact null distribution when requested or, by
//   default, when n < 50 -- but only without ties and without zeros;
//   otherwise the normal approximation with tie-corrected variance
//   n(n+1)(2n+1)/24 - sum(t^3 - t)/48 and continuity correction
//   sign(z) * 0.5 (two-sided), +0.5 (greater), -0.5 (less).
//   Two-sided exact p = min(1, 2 * P(V <= v)) if v <= n(n+1)/4, else
//   min(1, 2 * P(V >= v)).
// Rank sum: W = sum of the ranks of x in the pooled sample - m(m+1)/2 (the
//   Mann-Whitney U of x). Exact when requested or when m < 50 and n < 50,
//   without ties; else normal with variance
//   (mn/12) * ((m+n+1) - sum(t^3 - t)/((m+n)(m+n-1))) and the same correction.
// Estimate: the Hodges-Lehmann estimate, i.e. the median of the Walsh
//   averages (d_i + d_j)/2, i <= j, of the non-zero differences (signed rank)
//   or the median of all x_i - y_j (rank sum). R returns exactly this in its
//   exact branch (with conf.int = TRUE); in its normal branch R finds the root
//   of the standardised statistic with uniroot (tol 1e-4), which lands on or
//   within the flat step around this median: a definitional difference of at
//   most the gap between the two middle averages, documented in docs/methods.md.
// Check value (Cureton 1967, JASA 62:1068-1069 [from memory]; R 4.2.2 wilcox.test): Darwin's Zea mays data as in Cureton,
// differences 6,8,14,16,23,24,28,29,41,-48,49,56,60,-67,75: V = 96, exact
// two-sided p = 0.041259765625.
#include <cstdint>
#include <string>
#include <vector>

#include "stats/binomial.h"

namespace twinprobe::stats {

enum class RankMethod { kAuto, kExact, kNormal };

struct RankTestResult {
  double statistic = 0;  // V (signed rank) or W (rank sum), as R reports it
  double p_value = 1;    // NaN when undefined (every difference zero)
  double estimate = 0;   // Hodges-Lehmann; NaN when no non-zero difference
  bool exact = false;    // the p-value came from the exact null distribution
  bool exact_refused = false;  // exact was asked for but ties or zeros forced the normal approximation (R warns)
  bool ties = false;
  int64_t zeros = 0;     // zero differences dropped (signed rank)
  int64_t n = 0;         // non-zero differences (signed rank) or m + n (rank sum)
  double z = 0;          // standardised statistic (normal approximation only)
};

// Signed-rank test of the differences `d` (paired: d_i = x_i - y_i) against
// location 0. `correct` is R's continuity correction (default TRUE).
RankTestResult WilcoxonSignedRank(const std::vector<double>& d, Alternative alternative = Alternative::kTwoSided,
                                  RankMethod method = RankMethod::kAuto, bool correct = true);

// Rank-sum (Mann-Whitney) test of x against y. Requires both non-empty.
RankTestResult MannWhitney(const std::vector<double>& x, const std::vector<double>& y,
                           Alternative alternative = Alternative::kTwoSided, RankMethod method = RankMethod::kAuto,
                           bool correct = true);

struct SignTestResult {
  int64_t positive = 0, negative = 0, zeros = 0;
  double p_value = 1;  // binom.test(positive, positive + negative, 1/2); 1 when no non-zero difference
};

// Sign test (Arbuthnott 1710; e.g. Conover 1999, Practical Nonparametric
// Statistics, 3rd ed., section 3.4 [from memory]): zeros dropped, the number
// of positive differences ~ Binomial(n, 1/2). Two-sided p as R's binom.test
// with p = 1/2, which is min(1, 2 * P(X <= min(k, n - k))).
SignTestResult SignTest(const std::vector<double>& d, Alternative alternative = Alternative::kTwoSided);

// Null distributions as R's psignrank / pwilcox: P(V <= q) for n non-zero
// differences, P(W <= q) for sample sizes m and n. Lower tail; exact.
double PSignRank(double q, int64_t n);
double PWilcox(double q, int64_t m, int64_t n);

// Average ranks (R's rank(), ties.method = "average"), 1-based.
std::vector<double> AverageRanks(const std::vector<double>& values);

}  // namespace twinprobe::stats
