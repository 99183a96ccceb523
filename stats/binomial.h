#pragma once
// Binomial exact test and single-proportion intervals.
#include <cstdint>

#include "stats/pvalue.h"

namespace twinprobe::stats {

struct Interval {
  double low = 0;
  double high = 1;
};

enum class Alternative { kTwoSided, kLess, kGreater };

// Clopper & Pearson (1934), Biometrika 26:404-413: the exact interval for a
// binomial proportion, lower = qbeta((1-conf)/2, x, n-x+1) (0 when x = 0),
// upper = qbeta(1-(1-conf)/2, x+1, n-x) (1 when x = n); as R's binom.test.
// Requires 0 <= x <= n, n > 0, 0 < conf < 1.
Interval ClopperPearson(int64_t x, int64_t n, double conf);

// One-sided Clopper–Pearson bounds as R's binom.test with
// alternative = "less" ([0, qbeta(conf, x+1, n-x)]) or "greater"
// ([qbeta(1-conf, x, n-x+1), 1]); kTwoSided gives ClopperPearson().
Interval ClopperPearson(int64_t x, int64_t n, double conf, Alternative alternative);

// Wilson (1927), J. Am. Stat. Assoc. 22:209-212, score interval without
// continuity correction: (p + z^2/2n -+ z sqrt(p(1-p)/n + z^2/4n^2)) /
// (1 + z^2/n), z = qnorm(1 - (1-conf)/2); lower is 0 when x = 0 and upper is
// 1 when x = n. Equals R's prop.test(x, n, correct = FALSE)$conf.int.
// Requires 0 <= x <= n, n > 0, 0 < conf < 1.
Interval Wilson(int64_t x, int64_t n, double conf);

// P(X <= k) for X ~ Binomial(n, p), through the regularised incomplete beta
// so it stays accurate in the far tail. Requires 0 <= p <= 1.
double BinomCdf(int64_t k, int64_t n, double p);

// log P(X <= k) (upper = false) or log P(X >= k) (upper = true) for X ~
// Binomial(n, p); stays finite when the probability underflows a double
// (the tail is then summed term by term from k outwards in log space).
double LogBinomTail(int64_t k, int64_t n, double p, bool upper);

struct BinomTestResult {
  PValue p;
  double estimate = 0;  // x / n
  Interval ci;          // Clopper–Pearson, one-sided for one-sided tests
};

// Exact binomial test of H0: success probability = p0, as R's binom.test.
// less: P(X <= x); greater: P(X >= x); two-sided: the sum of P(X = i) over
// every i with P(X = i) <= P(X = x) * (1 + 1e-7) (R's relative fuzz, so that
// outcomes exactly as likely as the observed one count despite rounding);
// 1 when x = n p0. Clopper–Pearson interval at `conf`.
// Requires 0 <= x <= n, n > 0, 0 <= p0 <= 1, 0 < conf < 1.
BinomTestResult BinomTest(int64_t x, int64_t n, double p0, Alternative alternative, double conf);

}  // namespace twinprobe::stats
