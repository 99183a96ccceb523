#pragma once
// Power and sample size for a sets design: each vacancy receives one probe of
// each of k arms (a factor varied within sets), with callback rates r_1..r_k.
//
// Model: within a vacancy the k outcomes are independent with those rates.
// Real vacancies differ in how readily they call anyone back, which makes
// outcomes in a set positively correlated; with the rates held fixed that
// lowers the number of discordant sets' variance and raises the power of
// within-set tests, so the numbers here are conservative for such designs.
//
// Two goals, as the analysis tests them:
// - the overall test, Cochran's Q (stats/cochran_q.h) against chi-square on
//   k - 1 df at alpha. Its power is the probability of the outcome patterns
//   (2^k per vacancy, multinomial over N vacancies) that reject: summed
//   exactly over every composition of N into patterns when there are at most
//   kMaxSetsCompositions of them, else estimated from `replicates` simulated
//   studies drawn with stats::Rng(seed), with Monte Carlo standard error
//   sqrt(p (1 - p) / replicates);
// - the smallest pairwise difference after correction: the pair of arms with
//   the smallest nonzero |r_i - r_j|, tested by the exact McNemar test at
//   alpha / m with m = k (k - 1) / 2 (Bonferroni, the first and strictest
//   step of Holm); its power is exact (stats/power_paired.h with p10 =
//   r_i (1 - r_j), p01 = r_j (1 - r_i)). That is a lower bound: the
//   analysis adjusts by Holm's step-down (stats/pairwise.h), which rejects
//   the pair whenever Bonferroni does and also when the other pairs' smaller
//   p-values are rejected first. So the power after Holm, as analysed, is
//   computed too, with the overall test: summed exactly over the
//   compositions, or from the same simulated studies.
#include <cstdint>
#include <vector>

#include "stats/power_paired.h"

namespace twinprobe::stats {

inline constexpr double kMaxSetsCompositions = 3e5;

struct SetsPower {
  double overall = 0;           // power of Cochran's Q
  double overall_se = 0;        // Monte Carlo standard error (0 when exact)
  bool overall_exact = false;
  int replicates = 0;           // simulated studies (0 when exact)
  double pairwise = 0;          // power for the smallest pairwise gap at alpha / m (exact; Bonferroni)
  double pairwise_holm = 0;     // the same pair rejected after Holm over all m pairs (as analysed)
  double pairwise_holm_se = 0;  // its Monte Carlo standard error (0 when exact)
  int pair_first = -1, pair_second = -1;  // that pair (arm indices); -1 when all rates are equal
  double alpha_pairwise = 0;    // alpha / m
};

// Requires k = rates.size() >= 2, rates in [0, 1], vacancies >= 1,
// 0 < alpha < 1, replicates >= 1.
SetsPower PowerForSets(int64_t vacancies, const std::vector<double>& rates, double alpha, uint64_t seed,
                       int replicates = 10000, bool allow_exact = true);

// The overall test's power by simulation only (used by the sample-size
// search and by the tests that compare it with the exact sum).
double SimulatedCochranPower(int64_t vacancies, const std::vector<double>& rates, double alpha, uint64_t seed,
                             int replicates);

// The overall test's power by exact enumeration; requires the number of
// compositions (SetsCompositions) to be at most kMaxSetsCompositions.
double ExactCochranPower(int64_t vacancies, const std::vector<double>& rates, double alpha);
double SetsCompositions(int64_t vacancies, int k);  // C(N + 2^k - 1, 2^k - 1)

// The pair with the smallest nonzero gap and its alternative.
struct SmallestGap {
  int first = -1, second = -1;
  PairedAlternative alt;
};
SmallestGap SmallestPairwiseGap(const std::vector<double>& rates);

// Vacancies needed for `target` power. overall: the smallest N whose
// simulated power (same seed for every N, so the search sees one smooth
// curve) reaches the target, by bisection; pairwise: McNemarExactSampleSize's
// stable N for the smallest gap at alpha / m. found = false when no N up to
// max_vacancies reaches the target (or every rate is equal).
struct SetsSampleSize {
  bool overall_found = false, pairwise_found = false;
  int64_t overall = 0, pairwise = 0;
};
SetsSampleSize SampleSizeForSets(const std::vector<double>& rates, double alpha, double target, uint64_t seed,
                                 int replicates = 4000, int64_t max_vacancies = 200000);

}  // namespace twinprobe::stats
