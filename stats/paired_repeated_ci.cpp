#include "stats/paired_repeated_ci.h"

#include <cmath>

#include "stats/sequential_normal.h"

namespace twinprobe::stats {

std::vector<RepeatedInterval> RepeatedConfidenceIntervals(const std::vector<DiscordantCounts>& counts,
                                                          const std::vector<double>& information, double alpha,
                                                          Spending spending) {
  const std::vector<double> z = NormalSpendingBoundaries(information, alpha, spending);
  std::vector<RepeatedInterval> out;
  for (size_t k = 0; k < counts.size(); ++k) {
    RepeatedInterval r;
    r.information = information[k];
    r.boundary_z = z[k];
    // Two-sided nominal level of the look: P(|Z| >= c_k) = erfc(c_k / sqrt 2).
    r.nominal_conf = 1 - std::erfc(z[k] / std::sqrt(2.0));
    r.odds_ratio = ConditionalOddsRatio(PairedCounts{0, counts[k].b, counts[k].c, 0}, r.nominal_conf);
    out.push_back(r);
  }
  return out;
}

}  // namespace twinprobe::stats
