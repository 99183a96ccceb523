#include "stats/cluster_permutation.h"

#include <algorithm>
#include <cstdlib>

#include "stats/random.h"

namespace twinprobe::stats {
namespace {

// The exact null distribution of sum_e s_e d_e over sums -total..total.
std::vector<double> FlipDistribution(const std::vector<int64_t>& d, int64_t total) {
  std::vector<double> mass(static_cast<size_t>(2 * total + 1), 0.0), next(mass.size());
  mass[static_cast<size_t>(total)] = 1;
  int64_t reach = 0;  // sums so far lie in [-reach, reach]
  for (int64_t step : d) {
    std::fill(next.begin(), next.end(), 0.0);
    for (int64_t s = -reach; s <= reach; ++s) {
      const double m = mass[static_cast<size_t>(s + total)];
      if (m == 0) continue;
      next[static_cast<size_t>(s + step + total)] += 0.5 * m;
      next[static_cast<size_t>(s - step + total)] += 0.5 * m;
    }
    reach += step;
    mass.swap(next);
  }
  return mass;
}

}  // namespace

ClusterFlipResult ClusterFlipTest(const std::vector<DiscordantCounts>& employers, uint64_t seed, int64_t resamples) {
  ClusterFlipResult r;
  std::vector<int64_t> d;  // |b_e - c_e|; the sign is the flip's to choose
  int64_t total = 0;
  for (const auto& e : employers) {
    r.statistic += e.b - e.c;
    if (e.b != e.c) d.push_back(std::llabs(e.b - e.c)), total += std::llabs(e.b - e.c);
  }
  r.employers = static_cast<int>(d.size());
  if (d.empty()) return r;  // T* = 0 = T always: every p is 1
  const int64_t t = r.statistic, abs_t = std::llabs(t);
  if (static_cast<double>(d.size()) * static_cast<double>(2 * total + 1) <= static_cast<double>(kMaxExactClusterSteps)) {
    const std::vector<double> mass = FlipDistribution(d, total);
    double greater = 0, less = 0, two = 0;
    for (int64_t s = -total; s <= total; ++s) {
      const double m = mass[static_cast<size_t>(s + total)];
      if (s >= t) greater += m;
      if (s <= t) less += m;
      if (std::llabs(s) >= abs_t) two += m;
    }
    r.p_greater = std::min(1.0, greater), r.p_less = std::min(1.0, less), r.p_two_sided = std::min(1.0, two);
    return r;
  }
  r.exact = false;
  r.resamples = resamples;
  Rng rng(seed);
  int64_t greater = 0, less = 0, two = 0;
  for (int64_t i = 0; i < resamples; ++i) {
    int64_t s = 0;
    uint64_t bits = 0;
    for (size_t j = 0; j < d.size(); ++j) {
      if ((j & 63) == 0) bits = rng.Next();  // one random word gives 64 employers their signs
      s += (bits >> (j & 63)) & 1 ? d[j] : -d[j];
    }
    greater += s >= t, less += s <= t, two += std::llabs(s) >= abs_t;
  }
  const double denom = static_cast<double>(resamples + 1);
  r.p_greater = static_cast<double>(1 + greater) / denom;
  r.p_less = static_cast<double>(1 + less) / denom;
  r.p_two_sided = static_cast<double>(1 + two) / denom;
  return r;
}

}  // namespace twinprobe::stats
