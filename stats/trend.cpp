#include "stats/trend.h"

#include <cmath>

#include "stats/pvalue.h"

namespace twinprobe::stats {

TrendTest CochranArmitage(const std::vector<int64_t>& positives, const std::vector<int64_t>& probes,
                          const std::vector<double>& scores) {
  TrendTest t;
  double n = 0, x = 0, ns = 0;
  for (size_t i = 0; i < probes.size(); ++i) {
    n += static_cast<double>(probes[i]);
    x += static_cast<double>(positives[i]);
    ns += static_cast<double>(probes[i]) * scores[i];
  }
  if (n == 0) return t;
  const double p = x / n, s_bar = ns / n;
  double numerator = 0, spread = 0;
  for (size_t i = 0; i < probes.size(); ++i) {
    const double d = scores[i] - s_bar;
    numerator += static_cast<double>(positives[i]) * d;
    spread += static_cast<double>(probes[i]) * d * d;
  }
  const double variance = p * (1 - p) * spread;
  if (!(variance > 0)) return t;
  t.defined = true;
  t.z = numerator / std::sqrt(variance);
  t.statistic = t.z * t.z;
  t.p = ChiSquareUpper(t.statistic, 1).p;
  return t;
}

}  // namespace twinprobe::stats
