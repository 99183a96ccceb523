#pragma once
// Unpaired 2x2 tables: rows are the reference arm and the other arm, columns
// positive and negative outcome:
//            positive  negative
//   reference    a         b
//   other        c         d
// (calc fisher --table a,b,c,d). In R this is matrix(c(a, c, b, d), 2).
#include <cstdint>

#include "stats/binomial.h"
#include "stats/pvalue.h"

namespace twinprobe::stats {

struct Table2x2 {
  int64_t a = 0, b = 0, c = 0, d = 0;
  int64_t n() const { return a + b + c + d; }
};

struct FisherResult {
  PValue p;
  // Conditional maximum-likelihood odds ratio (not ad/bc) and its exact
  // interval, solved to full precision (see stats/conditional_or.h).
  double estimate = 0;
  Interval ci;
  int64_t support_lo = 0, support_hi = 0;  // range of a given the margins
};

// Fisher's exact test (Fisher 1935, The Design of Experiments, section 2;
// Agresti 2002, Categorical Data Analysis, section 3.5.1) of H0: odds ratio
// = 1, as R's fisher.test on matrix(c(a, c, b, d), 2). Given all margins, a
// is hypergeometric. less: P(A <= a); greater: P(A >= a); two-sided: the sum
// of P(A = s) over every s with P(A = s) <= P(A = a) * (1 + 1e-7) (R's
// relative fuzz). Estimate and interval as SolveConditional().
// Requires counts >= 0, 0 < conf < 1.
FisherResult FisherTest(const Table2x2& t, Alternative alternative, double conf);

// The sample odds ratio ad / (bc) with Woolf's (1955, Ann Hum Genet
// 19:251-253) logit interval exp(log OR -+ z sqrt(1/a + 1/b + 1/c + 1/d)),
// z = qnorm(1 - (1-conf)/2); as statsmodels' Table2x2.oddsratio_confint.
// No cell correction: with a zero cell the estimate is 0, infinite or NaN
// (0/0) and the interval is NaN (Woolf's variance is infinite).
struct SampleOddsRatio {
  double estimate = 0;
  Interval ci;
};
SampleOddsRatio WoolfOddsRatio(const Table2x2& t, double conf);

}  // namespace twinprobe::stats
