#pragma once
// Stratified 2x2 tables (one per stratum: occupation, region, wave ...),
// each laid out as in stats/fisher.h (rows reference / other arm, columns
// positive / negative). In R: array(c(a1, c1, b1, d1, a2, ...), c(2, 2, K)).
#include <vector>

#include "stats/binomial.h"
#include "stats/fisher.h"
#include "stats/pvalue.h"

namespace twinprobe::stats {

struct MantelHaenszelResult {
  int strata_used = 0;  // strata with at least two observations
  // Mantel & Haenszel (1959), J Natl Cancer Inst 22:719-748:
  // OR_MH = sum(a d / n) / sum(b c / n); infinite when the denominator is 0
  // and the numerator is not, NaN when both are 0.
  double estimate = 0;
  // Robins, Breslow & Greenland (1986), Biometrics 42:311-323, variance of
  // log OR_MH; interval OR_MH exp(-+ z sd). NaN when OR_MH is 0, infinite or NaN.
  double log_sd = 0;
  Interval ci;
  // Cochran–Mantel–Haenszel statistic (Cochran 1954; Mantel & Haenszel
  // 1959) as R's mantelhaen.test: DELTA = sum(a - (a+b)(a+c)/n),
  // X^2 = (|DELTA| - Y)^2 / sum((a+b)(c+d)(a+c)(b+d) / (n^2 (n-1))) on 1 df,
  // with Y = 0.5 (continuity correction, R's default correct = TRUE) when
  // |DELTA| >= 0.5, else Y = 0. NaN when the variance is 0.
  double delta = 0;
  double chi2 = 0;  // uncorrected
  PValue chi2_p;
  double chi2_corrected = 0;
  PValue chi2_corrected_p;
};

// Requires counts >= 0, 0 < conf < 1. Strata with fewer than two
// observations carry no information (every term is 0) and are left out; R's
// mantelhaen.test refuses them instead.
MantelHaenszelResult MantelHaenszel(const std::vector<Table2x2>& strata, double conf);

// Breslow & Day (1980), Statistical Methods in Cancer Research I, section
// 4.4, test of homogeneity of the odds ratios across strata, with Tarone's
// (1985, Biometrika 72:91-95) correction. For each stratum the expected
// A_k solves A(r2 - c1 + A) / ((r1 - A)(c1 - A)) = OR_MH inside the support,
// V_k = 1 / (1/A + 1/(r1-A) + 1/(c1-A) + 1/(r2-c1+A)),
// BD = sum (a_k - A_k)^2 / V_k, Tarone = BD - (sum a_k - sum A_k)^2 / sum V_k,
// both on K - 1 df (K = strata used). As statsmodels'
// StratifiedTable.test_equal_odds(adjust = False / True). Strata with a zero
// margin (V_k = 0) are left out. NaN when fewer than 2 strata remain or
// OR_MH is 0, infinite or NaN.
struct BreslowDayResult {
  int strata_used = 0;
  double df = 0;
  double statistic = 0;
  PValue p;
  double tarone = 0;
  PValue tarone_p;
};
BreslowDayResult BreslowDay(const std::vector<Table2x2>& strata);

}  // namespace twinprobe::stats
