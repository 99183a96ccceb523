#pragma once
// The test of a factor varied between vacancies at the level it was
// randomised at. The plan gives each vacancy one level of such a factor by
// blocked randomisation within the strata (planner/assign.cpp), so the
// vacancy, not the probe, is the unit: the probes of one vacancy share its
// employer and its level, and the k x 2 table of probes (analysis/k_level.h)
// counts them as independent. This test re-assigns the levels to the
// analysed vacancies within the same blocks (each block keeps its number of
// vacancies per level) and compares
//
//   T = sum_j S_j^2 / n_j,
//
// S_j the positive probes of the n_j vacancies at level j, with its value
// under the re-assignments (large T is extreme). Given the blocks' totals T
// orders the assignments as the between-level sum of squares of the
// vacancies' positive counts does (a one-way analysis of variance statistic
// under randomisation; Edgington & Onghena 2007, Randomization Tests, 4th
// ed., ch. 4), and with two levels as the absolute difference of their mean
// counts (two-sided). The p-value is Monte Carlo, p = (1 + #{T* >= T}) /
// (1 + resamples) (stats/permutation.h), seeded from the design.
#include <cstdint>
#include <string>
#include <vector>

#include "analysis/effects.h"

namespace twinprobe {

struct VacancyPermutationTest {
  bool present = false;
  int64_t vacancies = 0;   // analysed vacancies (complete sets)
  int64_t blocks = 0;      // blocks with vacancies of two or more levels (the others cannot change T)
  std::vector<int64_t> vacancies_by_level, positive_by_level;  // n_j and S_j in `levels` order
  double statistic = 0;    // T
  double p = 1;            // Monte Carlo permutation p
  int64_t resamples = 0;
  double monte_carlo_se = 0;  // sqrt(p (1 - p) / resamples)
};

// `arm_level[arm]` is the factor's level index of each arm (-1: none), `k`
// its number of levels. A vacancy's block is its strata values and the
// levels of every other factor constant within its set (`other_levels`,
// one arm -> level vector per other factor). Sets whose probes do not share
// one level of the factor are left out. present = false when no block holds
// vacancies of two levels. Requires resamples >= 1.
VacancyPermutationTest TestByVacancy(const std::vector<SetOutcome>& sets, const std::vector<int>& arm_level, size_t k,
                                     const std::vector<std::vector<int>>& other_levels, uint64_t seed,
                                     int64_t resamples = 99'999);

}  // namespace twinprobe
