#pragma once
// Binomial exact test and single-proportion intervals.
#include <cstdint>

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

// P(X <= k) for X ~ Binomial(n, p), through the regularised incomplete beta
// so it stays accurate in the far tail. Requires 0 <= p <= 1.
double BinomCdf(int64_t k, int64_t n, double p);

}  // namespace twinprobe::stats
