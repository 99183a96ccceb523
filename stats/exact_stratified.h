#pragma once
// Exact conditional test of a common odds ratio in K 2x2 tables (layout as
// stats/stratified.h): given every stratum's margins, S = sum of the a_k has
// the convolution of the strata's hypergeometric distributions under
// H0: common OR = 1, and P(S = s; psi) proportional to that times psi^s
// under a common OR psi (Mehta, Patel & Gray 1985, JASA 80:969-973; Agresti
// 2002, Categorical Data Analysis, section 6.7.5). As R's
// mantelhaen.test(exact = TRUE): two-sided p = sum of P(S = s) over every s
// with P(S = s) <= P(S = s_obs) (1 + 1e-7); conditional MLE and exact
// interval as stats/conditional_or.h (full precision; R's uniroot gives
// about four digits).
#include <cstdint>
#include <optional>
#include <vector>

#include "stats/binomial.h"
#include "stats/fisher.h"
#include "stats/pvalue.h"

namespace twinprobe::stats {

struct ExactStratifiedResult {
  int64_t statistic = 0;  // S = sum a_k
  int64_t support_lo = 0, support_hi = 0;
  PValue p;
  double estimate = 0;
  Interval ci;
};

// The convolution costs about (support width)^2 operations summed over the
// strata. Returns nothing when that exceeds `max_work` (default 2e9, a few
// seconds) so that a caller can say so instead of hanging; use the
// Mantel–Haenszel test there. Requires counts >= 0, 0 < conf < 1.
std::optional<ExactStratifiedResult> ExactCommonOddsRatio(const std::vector<Table2x2>& strata,
                                                          Alternative alternative, double conf,
                                                          double max_work = 2e9);

}  // namespace twinprobe::stats
