#pragma once
// Every pair of levels compared, not only each level against the reference,
// with the design's multiple-comparison correction over all k (k - 1) / 2
// comparisons (stats/adjust.h, as R's p.adjust).
//
// Within sets (each vacancy received every level): for levels i < j the
// paired table of the sets (both, only i, only j, neither) and the exact
// McNemar test (stats/mcnemar.h). Between vacancies or unpaired: the 2 x 2
// table of positives and negatives of the two levels and Fisher's exact test
// (stats/fisher.h). The difference is rate_i - rate_j.
#include <cstdint>
#include <vector>

#include "stats/adjust.h"

namespace twinprobe::stats {

struct PairwiseComparison {
  int first = 0, second = 0;  // level indices, first < second
  double rate_first = 0, rate_second = 0;
  double difference = 0;      // rate_first - rate_second
  int64_t only_first = 0, only_second = 0;  // discordant sets (within only)
  double p = 1;               // unadjusted two-sided
  double p_adjusted = 1;
};

// Requires rows of equal length k >= 2 with 0/1 entries. Pairs in the order
// (0,1), (0,2), ..., (1,2), ...
std::vector<PairwiseComparison> PairwiseWithin(const std::vector<std::vector<int>>& sets, Adjustment method);

// Requires equal lengths k >= 2, n_i >= 1, 0 <= x_i <= n_i.
std::vector<PairwiseComparison> PairwiseBetween(const std::vector<int64_t>& positives,
                                                const std::vector<int64_t>& probes, Adjustment method);

}  // namespace twinprobe::stats
