#pragma once
// Cochran's Q: are k arms called back equally often when every vacancy's set
// holds one probe of each arm (a factor varied within sets)?
//
// Cochran (1950), "The comparison of percentages in matched samples",
// Biometrika 37:256-266: with C_j the positives of arm j, R_i the positives
// of set i and N the grand total,
//   Q = (k - 1) (k sum_j C_j^2 - N^2) / (k N - sum_i R_i^2),
// referred to chi-square on k - 1 df. Sets with all or no positives add
// nothing. With k = 2 it is McNemar's uncorrected statistic (b - c)^2/(b + c).
//
// Exact permutation version: under no arm effect, given each set's number
// of positives R_i, every arrangement of them over the k probes is equally
// likely (the permutation argument of Cochran 1950, section 4). N and
// sum R_i^2 are fixed, so Q orders the arrangements as sum_j C_j^2 does; the
// exact p is P(sum C_j^2 >= observed), from the distribution of the column
// totals built set by set. That distribution is symmetric in the arms, so
// only sorted column totals are kept. The cost is bounded: when building it
// would take more than kMaxExactWork state updates (summed over the sets)
// the exact p is left out (there are then many informative sets, and the
// asymptotic p is reliable).
#include <cstdint>
#include <optional>
#include <vector>

namespace twinprobe::stats {

inline constexpr double kMaxExactWork = 5e5;

struct CochranQ {
  int k = 0;
  int64_t sets = 0;              // complete sets used
  int64_t informative_sets = 0;  // with at least one positive and one negative
  std::vector<int64_t> positives;  // C_j per arm
  double statistic = 0;          // Q; 0 when no set is informative
  int df = 0;                    // k - 1
  double p_asymptotic = 1;       // chi-square upper tail (R: pchisq(Q, k - 1, lower.tail = FALSE))
  std::optional<double> p_exact; // permutation p, when feasible
};

// `sets`: one row per vacancy, k >= 2 outcomes (0 or 1) per row, all rows the
// same length (callers drop incomplete sets first).
CochranQ CochranQTest(const std::vector<std::vector<int>>& sets, bool exact = true);

}  // namespace twinprobe::stats
