#include "stats/binomial.h"

#include <boost/math/special_functions/beta.hpp>

namespace twinprobe::stats {

Interval ClopperPearson(int64_t x, int64_t n, double conf) {
  double tail = (1.0 - conf) / 2.0;
  Interval ci;
  ci.low = x == 0 ? 0.0 : boost::math::ibeta_inv(static_cast<double>(x), static_cast<double>(n - x + 1), tail);
  ci.high = x == n ? 1.0 : boost::math::ibeta_inv(static_cast<double>(x + 1), static_cast<double>(n - x), 1.0 - tail);
  return ci;
}

double BinomCdf(int64_t k, int64_t n, double p) {
  if (k < 0) return 0.0;
  if (k >= n) return 1.0;
  // P(X <= k) = I_{1-p}(n-k, k+1)
  return boost::math::ibetac(static_cast<double>(k + 1), static_cast<double>(n - k), p);
}

}  // namespace twinprobe::stats
