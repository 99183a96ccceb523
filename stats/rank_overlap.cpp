#include "stats/rank_overlap.h"

#include <algorithm>

namespace twinprobe::stats {

double JaccardDistance(std::vector<std::string> a, std::vector<std::string> b) {
  std::sort(a.begin(), a.end());
  a.erase(std::unique(a.begin(), a.end()), a.end());
  std::sort(b.begin(), b.end());
  b.erase(std::unique(b.begin(), b.end()), b.end());
  if (a.empty() && b.empty()) return 0.0;
  std::vector<std::string> both;
  std::set_intersection(a.begin(), a.end(), b.begin(), b.end(), std::back_inserter(both));
  const double inter = static_cast<double>(both.size());
  const double uni = static_cast<double>(a.size() + b.size()) - inter;
  return 1.0 - inter / uni;
}

}  // namespace twinprobe::stats
