#pragma once
// Comparing where two groups appear in ranked lists: the exposure gap, the
// earth mover's distance between their positions, the Mann-Whitney test on
// positions, and stratified permutation tests of the gap and the distance.
//
// Input: items of the two groups with their 1-based positions; label 0 is
// group a, label 1 group b; `blocks` lists the items of each listing (labels
// are exchanged only within a listing under the null hypothesis).
//   exposure_gap = mean v(position) over a - mean v(position) over b
//                  (Singh & Joachims 2018; v from stats/exposure.h)
//   emd          = W1 between the position distributions of a and b,
//                  pooled over listings (stats/wasserstein.h)
// Permutation p-values: two-sided (|gap|) for the gap, upper tail for the
// distance, each with its own stream of the seed (stats/permutation.h).
#include <cstdint>
#include <vector>

#include "stats/exposure.h"
#include "stats/permutation.h"
#include "stats/wilcoxon.h"

namespace twinprobe::stats {

struct TwoGroupPositions {
  std::vector<int32_t> position;  // >= 1
  std::vector<int32_t> label;     // 0 = a, 1 = b
  std::vector<std::vector<int32_t>> blocks;
};

struct GroupComparison {
  int64_t n_a = 0, n_b = 0;
  double exposure_a = 0, exposure_b = 0, exposure_gap = 0;
  double emd = 0;
  RankTestResult mann_whitney;  // positions of a against b (normal approximation when tied)
  PermutationResult gap_test;   // resamples = 0 when not run
  PermutationResult emd_test;
};

// Mean exposure difference a - b for a labelling (NaN if a group is empty).
double ExposureGap(const std::vector<double>& weight, const std::vector<int32_t>& label);
// W1 between the positions labelled 0 and 1 (positions 1..grid).
double PositionEmd(const std::vector<int32_t>& position, const std::vector<int32_t>& label, int32_t grid);

// All measures for two groups; permutation tests only when
// options.resamples > 0. Requires both groups non-empty.
GroupComparison CompareGroups(const TwoGroupPositions& sample, const DiscountSpec& discount,
                              const PermutationOptions& options);

}  // namespace twinprobe::stats
