#pragma once
// Neighbour groups and the widest split: where, among groups defined by
// several protected factors (e.g. gender x origin), a listing treats groups
// most differently.
//
// A cell is one combination of levels, one level per factor. Two cells are
// neighbours when they differ in exactly one factor's level (gender=f,
// origin=coastal and gender=m, origin=coastal). The disparity of a cell is
// the mean distance between it and each of its neighbours: comparing only
// neighbours attributes each gap to one factor at a time. This is the
// toolkit's own construction (no published source uses the term; the closest
// published designs are Hannák et al. 2013, WWW '13, one-attribute control
// accounts, and Chen, Ma, Hannák & Wilson 2018, CHI '18, per-attribute group
// comparisons).
//
// A split of the listed population is a partition of the cells defined by
// the protected factors: pick some factors, and for each picked factor a
// grouping of its levels into two or more blocks; the parts are the
// combinations of blocks. The widest split is the one whose parts are, on
// average over pairs of parts, furthest apart. Searching many splits and
// keeping the widest inflates the distance found, so its p-value comes from
// a permutation test of the maximum itself (the search is repeated on every
// resample; cf. Westfall & Young 1993, Resampling-Based Multiple Testing,
// on max-statistic resampling [from memory]).
#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "stats/permutation.h"

namespace twinprobe::stats {

using Cell = std::vector<int32_t>;  // level index per factor

// True when the cells differ in exactly one factor. Same length required.
bool AreNeighbours(const Cell& a, const Cell& b);

// disparity[i] = mean of distance(i, j) over the neighbours j of cell i that
// `usable(j)` accepts (all when `usable` is empty); NaN when there is none.
std::vector<double> NeighbourDisparity(const std::vector<Cell>& cells,
                                       const std::function<double(size_t, size_t)>& distance,
                                       const std::function<bool(size_t)>& usable = {});

// Indices of the k largest (or smallest) non-NaN values, extreme first; ties
// keep index order.
std::vector<size_t> TopK(const std::vector<double>& values, size_t k, bool largest);

struct Split {
  std::vector<int32_t> factors;                  // factors used, ascending
  std::vector<std::vector<int32_t>> block_of;    // per used factor: level -> block
  std::vector<int32_t> blocks;                   // per used factor: number of blocks
  int32_t parts = 0;                             // product of blocks
  // Part of a cell: mixed-radix number of its blocks.
  int32_t PartOf(const Cell& cell) const;
};

struct SplitCandidates {
  std::vector<Split> splits;
  bool exhaustive = true;  // false when the bound cut the search
};

// Every split of factors with the given numbers of levels: each non-empty
// set of factors, each grouping of each factor's levels into >= 2 blocks
// (set partitions, enumerated as restricted growth strings). When that is
// more than `max_candidates`, the search is bounded: sets of at most two
// factors, and for a factor with more than four levels only the groupings
// "one level against the rest" and "every level apart"; then truncated to
// `max_candidates` in enumeration order. Requires every factor >= 2 levels.
SplitCandidates CandidateSplits(const std::vector<int32_t>& levels_per_factor, size_t max_candidates);

// Places in one pooled sample: the position (1..grid) of each place and its
// unit (an item within a stratum, as in stats/rank_compare.h); each unit has
// a cell. The distance between two sets of places is the 1-Wasserstein
// distance between their position distributions (Wasserstein1OnGrid).
struct SplitSample {
  std::vector<int32_t> position;  // per place, 1-based, <= grid
  std::vector<int32_t> unit;      // per place: its unit (empty: place i is unit i)
  std::vector<int32_t> cell;      // per unit: index into `cells`
  std::vector<Cell> cells;
  int32_t grid = 0;               // largest position
};

// Mean, over pairs of non-empty parts, of the distance between the parts
// (0 when fewer than two parts hold places), for the cells `cell_of` of the units.
double SplitDistance(const Split& split, const SplitSample& sample, const std::vector<int32_t>& cell_of);

struct WidestSplit {
  size_t best = 0;          // index into candidates.splits
  double distance = 0;
  PermutationResult test;   // of the maximum over all candidates
  SplitCandidates candidates;
};

// Searches the candidates for the widest split and tests the maximum by
// shuffling the units' cells within `blocks` (lists of units, one per
// stratum). Requires at least one candidate.
WidestSplit FindWidestSplit(const SplitSample& sample, const std::vector<int32_t>& levels_per_factor,
                            const std::vector<std::vector<int32_t>>& blocks, size_t max_candidates,
                            const PermutationOptions& options);

}  // namespace twinprobe::stats
