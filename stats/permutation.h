#pragma once
// Seeded, stratified permutation tests. Under the null hypothesis that the
// group labels are exchangeable within each block (a block is one listing:
// positions are only comparable inside the list that holds them), the
// labels are shuffled within every block, the statistic is recomputed, and
//
//   p = (1 + #{resamples at least as extreme as observed}) / (1 + resamples)
//
// which is never 0 and is valid for a random sample of permutations (Phipson
// & Smyth 2010, "Permutation P-values should never be zero", Stat. Appl.
// Genet. Mol. Biol. 9(1), article 39; the same +1 rule as scipy's
// permutation_test for random resamples). "At least as extreme" allows for
// floating-point noise: a resample counts when it is within 1e-12 (relative)
// of the observed value, as scipy does with 100 machine epsilons.
//
// Randomness comes only from stats::Rng, so a seed reproduces a p-value on
// every platform.
#include <cstdint>
#include <functional>
#include <vector>

namespace twinprobe::stats {

enum class Tail {
  kGreater,   // large values are extreme (distances)
  kAbsolute,  // large |values| are extreme (signed gaps, two-sided)
};

// Called with (resamples done, resamples in total) now and then; may be empty.
using ProgressFn = std::function<void(int64_t done, int64_t total)>;

struct PermutationOptions {
  int64_t resamples = 9999;
  uint64_t seed = 1;
  ProgressFn progress;
};

struct PermutationResult {
  double observed = 0;
  double p_value = 1;
  int64_t resamples = 0;
  int64_t as_extreme = 0;  // resamples at least as extreme as observed
};

// `labels[i]` is the label of item i (any small integers); `blocks` lists the
// items of each block (every item in at most one block; items in no block
// keep their label). `statistic(labels)` computes the statistic for a
// labelling. Requires resamples >= 1.
PermutationResult PermutationTest(const std::vector<int32_t>& labels, const std::vector<std::vector<int32_t>>& blocks,
                                  const std::function<double(const std::vector<int32_t>&)>& statistic, Tail tail,
                                  const PermutationOptions& options);

// True when `candidate` is at least as extreme as `observed` under `tail`.
bool AtLeastAsExtreme(double candidate, double observed, Tail tail);

}  // namespace twinprobe::stats
