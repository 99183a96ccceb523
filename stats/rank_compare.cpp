#include "stats/rank_compare.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "stats/wasserstein.h"

namespace twinprobe::stats {

namespace {

// Working buffers for the statistics, reused across resamples.
struct EmdBuffers {
  std::vector<double> a, b;
};

double ExposureGapImpl(const std::vector<double>& weight, const std::vector<int32_t>& unit,
                       const std::vector<int32_t>& label) {
  double sum[2] = {0, 0};
  double n[2] = {0, 0};
  for (size_t i = 0; i < weight.size(); ++i) {
    const int32_t l = label[unit.empty() ? i : static_cast<size_t>(unit[i])];
    sum[l] += weight[i];
    n[l] += 1;
  }
  if (n[0] == 0 || n[1] == 0) return std::numeric_limits<double>::quiet_NaN();
  return sum[0] / n[0] - sum[1] / n[1];
}

double PositionEmdImpl(const std::vector<int32_t>& position, const std::vector<int32_t>& unit,
                       const std::vector<int32_t>& label, int32_t grid, EmdBuffers& buf) {
  buf.a.assign(static_cast<size_t>(grid), 0.0);
  buf.b.assign(static_cast<size_t>(grid), 0.0);
  for (size_t i = 0; i < position.size(); ++i)
    (label[unit.empty() ? i : static_cast<size_t>(unit[i])] == 0 ? buf.a : buf.b)[static_cast<size_t>(position[i] - 1)] +=
        1;
  return Wasserstein1OnGrid(buf.a, buf.b);
}

}  // namespace

double ExposureGap(const std::vector<double>& weight, const std::vector<int32_t>& unit,
                   const std::vector<int32_t>& label) {
  return ExposureGapImpl(weight, unit, label);
}

double PositionEmd(const std::vector<int32_t>& position, const std::vector<int32_t>& unit,
                   const std::vector<int32_t>& label, int32_t grid) {
  EmdBuffers buf;
  return PositionEmdImpl(position, unit, label, grid, buf);
}

GroupComparison CompareGroups(const TwoGroupPositions& s, const DiscountSpec& discount,
                              const PermutationOptions& options) {
  GroupComparison c;
  std::vector<double> weight(s.position.size());
  std::vector<double> pos_a, pos_b;
  int32_t grid = 1;
  auto label_of = [&](size_t i) { return s.label[s.unit.empty() ? i : static_cast<size_t>(s.unit[i])]; };
  for (size_t i = 0; i < s.position.size(); ++i) {
    weight[i] = PositionWeight(s.position[i], discount);
    grid = std::max(grid, s.position[i]);
    (label_of(i) == 0 ? pos_a : pos_b).push_back(s.position[i]);
  }
  c.n_a = static_cast<int64_t>(pos_a.size());
  c.n_b = static_cast<int64_t>(pos_b.size());
  double sum_a = 0, sum_b = 0;
  for (size_t i = 0; i < weight.size(); ++i) (label_of(i) == 0 ? sum_a : sum_b) += weight[i];
  c.exposure_a = sum_a / static_cast<double>(c.n_a);
  c.exposure_b = sum_b / static_cast<double>(c.n_b);
  c.exposure_gap = c.exposure_a - c.exposure_b;
  EmdBuffers buf;
  c.emd = PositionEmdImpl(s.position, s.unit, s.label, grid, buf);
  c.mann_whitney = MannWhitney(pos_a, pos_b);
  if (options.resamples > 0) {
    // Progress counts both tests as one stretch of 2 * resamples.
    PermutationOptions first = options;
    PermutationOptions second = options;
    if (options.progress) {
      first.progress = [&](int64_t done, int64_t total) { options.progress(done, 2 * total); };
      second.progress = [&](int64_t done, int64_t total) { options.progress(total + done, 2 * total); };
    }
    c.gap_test = PermutationTest(
        s.label, s.blocks, [&](const std::vector<int32_t>& l) { return ExposureGapImpl(weight, s.unit, l); }, Tail::kAbsolute,
        first);
    // A different stream for the second test, derived from the same seed.
    second.seed = options.seed ^ 0x9e3779b97f4a7c15ULL;
    c.emd_test = PermutationTest(
        s.label, s.blocks, [&](const std::vector<int32_t>& l) { return PositionEmdImpl(s.position, s.unit, l, grid, buf); },
        Tail::kGreater, second);
  }
  return c;
}

}  // namespace twinprobe::stats
