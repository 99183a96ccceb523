#include "stats/newcombe.h"

#include <cmath>

namespace twinprobe::stats {

RateDifference NewcombeDifference(int64_t x1, int64_t n1, int64_t x2, int64_t n2, double conf) {
  RateDifference r;
  r.rate_first = static_cast<double>(x1) / static_cast<double>(n1);
  r.rate_second = static_cast<double>(x2) / static_cast<double>(n2);
  r.difference = r.rate_first - r.rate_second;
  const Interval w1 = Wilson(x1, n1, conf), w2 = Wilson(x2, n2, conf);
  const double p1 = r.rate_first, p2 = r.rate_second;
  r.ci.low = r.difference - std::sqrt((p1 - w1.low) * (p1 - w1.low) + (w2.high - p2) * (w2.high - p2));
  r.ci.high = r.difference + std::sqrt((w1.high - p1) * (w1.high - p1) + (p2 - w2.low) * (p2 - w2.low));
  return r;
}

}  // namespace twinprobe::stats
