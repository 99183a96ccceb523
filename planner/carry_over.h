#pragma once
// The carry-over balance of a plan: how often each arm was sent directly
// after each other arm of its set (the "arm x previous arm" table). A
// response may depend on the application the employer saw just before; with
// send orders from Williams designs (planner/assign.h) every arm follows
// every other arm of its set equally often, so that carry-over is spread
// evenly over the comparisons instead of being confounded with one of them.
//
// The test: Pearson's chi-square goodness of fit of the counts of the
// possible ordered pairs (previous arm, arm: distinct arms of one set group,
// planner/set_groups.h) against equal counts within each group
// (stats/goodness_of_fit.h; df = pairs - groups). A balanced plan gives X2
// near 0 and p near 1. Cells that cannot occur (an arm after itself, arms of
// different between levels) are shown but not tested.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "planner/assign.h"
#include "stats/goodness_of_fit.h"

namespace twinprobe {

struct CarryOverBalance {
  bool present = false;            // false for unpaired designs (no order within a set)
  std::vector<std::string> arms;   // design order
  std::vector<int64_t> first;      // per arm: sets in which it was sent first
  std::vector<std::vector<int64_t>> after;  // [arm][previous arm]: probes of arm sent right after previous arm
  std::vector<std::vector<bool>> possible;  // [arm][previous arm]: the pair can occur
  int64_t pairs = 0;       // adjacent pairs counted
  int64_t max_spread = 0;  // largest difference between two possible cells of one group
  stats::GoodnessOfFit test;
};

CarryOverBalance ComputeCarryOver(const Design& design, const Plan& plan);

}  // namespace twinprobe
