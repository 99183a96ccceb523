#pragma once
// Pearson's chi-square goodness-of-fit test of observed counts against
// expected counts (Pearson 1900; Agresti 2002, section 1.5.2):
//   X^2 = sum over cells (O - E)^2 / E,  df = cells - constraints,
// p = upper tail of chi-square(df). `constraints` counts the totals the
// expected counts were fitted to (1 for one total; scipy.stats.chisquare's
// ddof is constraints - 1). Used for the carry-over balance of a plan
// (planner/carry_over.h), where the cells are the ordered pairs of arms.
#include <cstdint>
#include <vector>

namespace twinprobe::stats {

struct GoodnessOfFit {
  double statistic = 0;
  int df = 0;
  double p = 1;  // 1 when df <= 0
};

// Requires observed.size() == expected.size(), every expected count > 0.
GoodnessOfFit PearsonGoodnessOfFit(const std::vector<int64_t>& observed, const std::vector<double>& expected,
                                   int constraints);

}  // namespace twinprobe::stats
