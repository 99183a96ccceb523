#include "stats/permutation.h"

#include <algorithm>
#include <cmath>

#include "stats/random.h"

namespace twinprobe::stats {

bool AtLeastAsExtreme(double candidate, double observed, Tail tail) {
  if (tail == Tail::kAbsolute) {
    candidate = std::fabs(candidate);
    observed = std::fabs(observed);
  }
  // Equal statistics computed along different summation orders differ in
  // the last bits; treat them as ties (counted as extreme, conservatively).
  return candidate >= observed - 1e-12 * std::fabs(observed);
}

PermutationResult PermutationTest(const std::vector<int32_t>& labels, const std::vector<std::vector<int32_t>>& blocks,
                                  const std::function<double(const std::vector<int32_t>&)>& statistic, Tail tail,
                                  const PermutationOptions& options) {
  PermutationResult r;
  r.observed = statistic(labels);
  r.resamples = options.resamples;
  Rng rng(options.seed);
  std::vector<int32_t> work(labels);
  // Report about a hundred times in all: often enough for a smooth bar,
  // rarely enough to cost nothing.
  const int64_t every = std::max<int64_t>(1, options.resamples / 100);
  for (int64_t b = 0; b < options.resamples; ++b) {
    // Fisher-Yates within each block. Shuffling the already shuffled labels
    // again is still a uniform permutation of the block's original labels.
    for (const auto& block : blocks)
      for (size_t i = block.size(); i > 1; --i) {
        size_t j = static_cast<size_t>(rng.Below(i));
        std::swap(work[static_cast<size_t>(block[i - 1])], work[static_cast<size_t>(block[j])]);
      }
    if (AtLeastAsExtreme(statistic(work), r.observed, tail)) ++r.as_extreme;
    if (options.progress && ((b + 1) % every == 0 || b + 1 == options.resamples))
      options.progress(b + 1, options.resamples);
  }
  r.p_value = static_cast<double>(1 + r.as_extreme) / static_cast<double>(1 + r.resamples);
  return r;
}

}  // namespace twinprobe::stats
