#pragma once
// Repeated confidence intervals for the conditional odds ratio b/c of a
// paired study monitored at interim looks (Jennison & Turnbull 1989,
// "Interim analyses: the repeated confidence interval approach", JRSS B
// 51:305-361; Jennison & Turnbull 2000, Group Sequential Methods with
// Applications to Clinical Trials, ch. 9). At look k the interval is the one
// a fixed-sample analysis would give at the look's nominal level
// 1 - 2(1 - Phi(c_k)), with c_k the two-sided z-scale spending boundary of
// that look (stats/sequential_normal.h); the sequence then covers the true
// value at every look simultaneously with probability about 1 - alpha, so a
// study may report the interval of the look where it stopped (or any other)
// without the optimism of a naive 95% interval. The stage-wise ordering
// p-value for the same looks is StagewisePValue in stats/sequential.h.
//
// Here the fixed-sample interval is the exact one of ConditionalOddsRatio
// (Clopper–Pearson on b_k of b_k + c_k, mapped through p / (1 - p)), which
// keeps the exact test's conservatism; the z-scale boundaries come from the
// normal approximation, as in Jennison & Turnbull's construction.
#include <cstdint>
#include <vector>

#include "stats/paired.h"
#include "stats/paired_discordant.h"
#include "stats/sequential.h"

namespace twinprobe::stats {

struct RepeatedInterval {
  double information = 1;   // t_k
  double boundary_z = 0;    // c_k
  double nominal_conf = 0;  // 1 - 2 (1 - Phi(c_k))
  Estimate odds_ratio;      // b_k / c_k with the interval at nominal_conf
};

// `counts[k]` are the cumulative discordant counts at look k and
// `information[k]` its information fraction (strictly increasing in (0, 1]).
// Requires equal lengths >= 1, nondecreasing counts, 0 < alpha < 1.
std::vector<RepeatedInterval> RepeatedConfidenceIntervals(const std::vector<DiscordantCounts>& counts,
                                                          const std::vector<double>& information, double alpha,
                                                          Spending spending);

}  // namespace twinprobe::stats
