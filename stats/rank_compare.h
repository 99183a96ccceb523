#pragma once
// Comparing where two groups appear in ranked lists: the exposure gap, the
// earth mover's distance between their positions, the Mann-Whitney test on
// positions, and stratified permutation tests of the gap and the distance.
//
// Input: the places (appearances) held by items of the two groups, with
// their 1-based positions. Labels belong to units: a unit is an item within
// a stratum, so an item shown in several lists of one query x location (a
// repeated fetch, another profile's view) keeps one label in every list.
// Label 0 is group a, 1 group b; `blocks` lists the units of each stratum,
// and labels are exchanged only within a block under the null hypothesis.
// Without units, every place is its own unit.
//   exposure_gap = mean v(position) over a's places - the same over b's
//                  (Singh & Joachims 2018; v from stats/exposure.h)
//   emd          = W1 between the position distributions of a and b,
//                  pooled over lists (stats/wasserstein.h)
// Permutation p-values: two-sided (|gap|) for the gap, upper tail for the
// distance, each with its own stream of the seed (stats/permutation.h).
// The Mann-Whitney test treats places as independent observations, which
// repeated lists are not; it is reported for reference only.
#include <cstdint>
#include <vector>

#include "stats/exposure.h"
#include "stats/permutation.h"
#include "stats/wilcoxon.h"

namespace twinprobe::stats {

struct TwoGroupPositions {
  std::vector<int32_t> position;  // per place, >= 1
  std::vector<int32_t> unit;      // per place: its unit (empty: place i is unit i)
  std::vector<int32_t> label;     // per unit: 0 = a, 1 = b
  std::vector<std::vector<int32_t>> blocks;  // units exchangeable with each other
};

struct GroupComparison {
  int64_t n_a = 0, n_b = 0;
  double exposure_a = 0, exposure_b = 0, exposure_gap = 0;
  double emd = 0;
  RankTestResult mann_whitney;  // positions of a against b (normal approximation when tied)
  PermutationResult gap_test;   // resamples = 0 when not run
  PermutationResult emd_test;
};

// Mean exposure difference a - b of the places, for a labelling of units
// (`unit` empty: place i is unit i). NaN if a group holds no place.
double ExposureGap(const std::vector<double>& weight, const std::vector<int32_t>& unit,
                   const std::vector<int32_t>& label);
// W1 between the positions of the places labelled 0 and 1 (positions 1..grid).
double PositionEmd(const std::vector<int32_t>& position, const std::vector<int32_t>& unit,
                   const std::vector<int32_t>& label, int32_t grid);

// All measures for two groups; permutation tests only when
// options.resamples > 0. Requires both groups non-empty.
GroupComparison CompareGroups(const TwoGroupPositions& sample, const DiscountSpec& discount,
                              const PermutationOptions& options);

}  // namespace twinprobe::stats
