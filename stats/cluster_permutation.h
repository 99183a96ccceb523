#pragma once
// Inference clustered by employer. When one employer receives several
// vacancies' pairs, its pairs are not independent: a firm that prefers one
// arm does so in all of them. Under the null hypothesis of no difference
// between the arms, the two profiles of every pair are exchangeable, and so
// are the labels of all of one employer's pairs at once: swapping the arms
// for a whole employer turns its (b_e, c_e) into (c_e, b_e). The test
// statistic is T = sum_e (b_e - c_e) = sum(b) - sum(c), and its null
// distribution is that of sum_e s_e (b_e - c_e) with independent fair signs
// s_e (a cluster sign-flip randomisation test in the sense of Fisher 1935,
// The Design of Experiments).
// With one pair per employer it is the exact McNemar (sign) test.
#include <cstdint>
#include <vector>

#include "stats/binomial.h"
#include "stats/paired_discordant.h"
#include "stats/pvalue.h"

namespace twinprobe::stats {

struct ClusterFlipResult {
  int64_t statistic = 0;  // T = sum(b) - sum(c)
  int employers = 0;      // employers with b_e != c_e (the others never change T)
  // P(T* >= T) (greater: the reference arm favoured), P(T* <= T) (less) and
  // P(|T*| >= |T|) (two-sided) under the sign flips.
  double p_greater = 1, p_less = 1, p_two_sided = 1;
  bool exact = true;       // the full distribution was computed
  int64_t resamples = 0;   // Monte Carlo resamples when !exact
  double p(Alternative a) const {
    return a == Alternative::kGreater ? p_greater : a == Alternative::kLess ? p_less : p_two_sided;
  }
};

// Above this many steps (employers x width of the sum's support) the exact
// distribution gives way to Monte Carlo.
inline constexpr int64_t kMaxExactClusterSteps = 50'000'000;

// Exact: the distribution of sum_e s_e d_e by convolution over employers
// (each step halves the mass between +d_e and -d_e), so its cost is
// employers x (2 sum|d_e| + 1) steps, not 2^employers. Beyond
// kMaxExactClusterSteps: `resamples` random sign vectors from Rng(seed),
// p = (1 + #{at least as extreme}) / (1 + resamples) (Phipson & Smyth 2010,
// Stat Appl Genet Mol Biol 9(1):39). Requires counts >= 0, resamples >= 1.
ClusterFlipResult ClusterFlipTest(const std::vector<DiscordantCounts>& employers, uint64_t seed,
                                  int64_t resamples = 99'999);

}  // namespace twinprobe::stats
