#pragma once
// Exact power of Fisher's exact test for the unpaired design: two independent
// arms of n vacancies each, x1 ~ Binomial(n, p1) positive callbacks in the
// reference arm and x2 ~ Binomial(n, p2) in the other; the analysis runs the
// two-sided Fisher test of stats/fisher.h (as R's fisher.test) on the table
// (x1, n - x1; x2, n - x2) and rejects when p <= alpha.
//   power = sum_{x1, x2} dbinom(x1; n, p1) dbinom(x2; n, p2) 1[p(x1, x2) <= alpha].
// Given the total m = x1 + x2 the test's p-value depends on x1 alone and is
// monotone on each side of the hypergeometric mode, so the rejection region
// for each m is two tails [lo, L(m)] and [U(m), hi], found by binary search
// with FisherTest itself (the analysis's own function decides every table).
// Binomial weights smaller than the 1e-17 tails are left out, as in
// stats/power_paired.h.
#include <cstdint>

namespace twinprobe::stats {

// Requires n_per_arm >= 1, p1 and p2 in [0, 1], 0 < alpha < 1.
double FisherExactPower(int64_t n_per_arm, double p1, double p2, double alpha);

// Smallest n per arm for a target power. Fisher power is not proven monotone
// in n and every evaluation costs a few milliseconds at audit sizes, so the
// search is a bisection (assuming monotonicity) followed by a check of the
// neighbourhood: `n` is the bisection result; `checked_from`..`checked_to`
// (1% or at least 5 values either side) were evaluated one by one, and
// `n_first` is the smallest n in that window with power >= target (n when none
// below it is), `dips_above` is true if some n in (n, checked_to] falls below
// the target. Requires p1 != p2, 0 < target < 1.
struct FisherSampleSize {
  bool found = false;  // false if no n <= max_n reaches the target
  int64_t n = 0;
  int64_t n_first = 0;
  double power_at_n = 0;
  int64_t checked_from = 0, checked_to = 0;
  bool dips_above = false;
};
FisherSampleSize FisherExactSampleSize(double p1, double p2, double alpha, double target, int64_t max_n = 1'000'000);

}  // namespace twinprobe::stats
