#include "stats/neighbour.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

#include "stats/wasserstein.h"

namespace twinprobe::stats {
namespace {

using Histograms = std::vector<std::vector<double>>;

// Position counts per cell (index 0 = position 1), into `h` (reused).
void CellHistograms(const SplitSample& sample, const std::vector<int32_t>& cell_of, Histograms& h) {
  h.resize(sample.cells.size());
  for (auto& row : h) row.assign(static_cast<size_t>(sample.grid), 0.0);
  for (size_t i = 0; i < sample.position.size(); ++i) {
    const size_t unit = sample.unit.empty() ? i : static_cast<size_t>(sample.unit[i]);
    h[static_cast<size_t>(cell_of[unit])][static_cast<size_t>(sample.position[i] - 1)] += 1;
  }
}

// Working space for DistanceFromHistograms, reused across resamples.
struct PartBuffers {
  Histograms part;
  std::vector<double> total;
};

double DistanceFromHistograms(const Split& split, const std::vector<Cell>& cells, const Histograms& cell_hist,
                              int32_t grid, PartBuffers& buf) {
  buf.part.resize(static_cast<size_t>(split.parts));
  for (auto& row : buf.part) row.assign(static_cast<size_t>(grid), 0.0);
  buf.total.assign(static_cast<size_t>(split.parts), 0.0);
  for (size_t c = 0; c < cells.size(); ++c) {
    const size_t p = static_cast<size_t>(split.PartOf(cells[c]));
    for (size_t k = 0; k < cell_hist[c].size(); ++k) {
      buf.part[p][k] += cell_hist[c][k];
      buf.total[p] += cell_hist[c][k];
    }
  }
  double sum = 0;
  int64_t pairs = 0;
  for (size_t a = 0; a < buf.part.size(); ++a)
    for (size_t b = a + 1; b < buf.part.size(); ++b) {
      if (buf.total[a] == 0 || buf.total[b] == 0) continue;
      sum += Wasserstein1OnGrid(buf.part[a], buf.part[b]);
      ++pairs;
    }
  return pairs ? sum / static_cast<double>(pairs) : 0.0;
}

// Every grouping of `levels` items into at least two blocks, as restricted
// growth strings (a[0] = 0, a[i] <= 1 + max(a[0..i-1])).
std::vector<std::vector<int32_t>> SetPartitions(int32_t levels) {
  std::vector<std::vector<int32_t>> out;
  std::vector<int32_t> a(static_cast<size_t>(levels), 0);
  std::function<void(int32_t, int32_t)> rec = [&](int32_t i, int32_t max_block) {
    if (i == levels) {
      if (max_block >= 1) out.push_back(a);
      return;
    }
    for (int32_t b = 0; b <= max_block + 1; ++b) {
      a[static_cast<size_t>(i)] = b;
      rec(i + 1, std::max(max_block, b));
    }
  };
  a[0] = 0;
  rec(1, 0);
  return out;
}

// The bounded groupings of one factor: one level against the rest, and
// every level apart.
std::vector<std::vector<int32_t>> BoundedPartitions(int32_t levels) {
  if (levels <= 4) return SetPartitions(levels);
  std::vector<std::vector<int32_t>> out;
  for (int32_t l = 0; l < levels; ++l) {
    std::vector<int32_t> a(static_cast<size_t>(levels), 0);
    a[static_cast<size_t>(l)] = 1;
    // Restricted growth form: the first level is always in block 0.
    if (l == 0)
      for (auto& x : a) x = 1 - x;
    out.push_back(a);
  }
  std::vector<int32_t> apart(static_cast<size_t>(levels));
  std::iota(apart.begin(), apart.end(), 0);
  out.push_back(apart);
  return out;
}

int32_t Blocks(const std::vector<int32_t>& grouping) {
  return 1 + *std::max_element(grouping.begin(), grouping.end());
}

// Appends the splits of one set of factors (cartesian product of their
// groupings), stopping at `limit` splits in all.
void AppendSplits(const std::vector<int32_t>& factors, const std::vector<std::vector<std::vector<int32_t>>>& groupings,
                  std::vector<Split>& out, size_t limit) {
  std::vector<size_t> choice(factors.size(), 0);
  for (;;) {
    if (out.size() >= limit) return;
    Split s;
    s.factors = factors;
    s.parts = 1;
    for (size_t k = 0; k < factors.size(); ++k) {
      const auto& g = groupings[static_cast<size_t>(factors[k])][choice[k]];
      s.block_of.push_back(g);
      s.blocks.push_back(Blocks(g));
      s.parts *= s.blocks.back();
    }
    out.push_back(std::move(s));
    size_t k = 0;
    while (k < factors.size() && ++choice[k] == groupings[static_cast<size_t>(factors[k])].size()) choice[k++] = 0;
    if (k == factors.size()) return;
  }
}

}  // namespace

bool AreNeighbours(const Cell& a, const Cell& b) {
  int differing = 0;
  for (size_t i = 0; i < a.size(); ++i) differing += a[i] != b[i];
  return differing == 1;
}

std::vector<double> NeighbourDisparity(const std::vector<Cell>& cells,
                                       const std::function<double(size_t, size_t)>& distance,
                                       const std::function<bool(size_t)>& usable) {
  std::vector<double> out(cells.size(), std::numeric_limits<double>::quiet_NaN());
  for (size_t i = 0; i < cells.size(); ++i) {
    if (usable && !usable(i)) continue;
    double sum = 0;
    int64_t count = 0;
    for (size_t j = 0; j < cells.size(); ++j) {
      if (j == i || !AreNeighbours(cells[i], cells[j]) || (usable && !usable(j))) continue;
      sum += distance(i, j);
      ++count;
    }
    if (count) out[i] = sum / static_cast<double>(count);
  }
  return out;
}

std::vector<size_t> TopK(const std::vector<double>& values, size_t k, bool largest) {
  std::vector<size_t> idx;
  for (size_t i = 0; i < values.size(); ++i)
    if (!std::isnan(values[i])) idx.push_back(i);
  std::stable_sort(idx.begin(), idx.end(),
                   [&](size_t a, size_t b) { return largest ? values[a] > values[b] : values[a] < values[b]; });
  if (idx.size() > k) idx.resize(k);
  return idx;
}

int32_t Split::PartOf(const Cell& cell) const {
  int32_t part = 0;
  for (size_t k = 0; k < factors.size(); ++k)
    part = part * blocks[k] + block_of[k][static_cast<size_t>(cell[static_cast<size_t>(factors[k])])];
  return part;
}

SplitCandidates CandidateSplits(const std::vector<int32_t>& levels_per_factor, size_t max_candidates) {
  SplitCandidates c;
  const int32_t f = static_cast<int32_t>(levels_per_factor.size());
  std::vector<std::vector<std::vector<int32_t>>> full, bounded;
  for (int32_t levels : levels_per_factor) {
    full.push_back(levels <= 8 ? SetPartitions(levels) : std::vector<std::vector<int32_t>>{});
    bounded.push_back(BoundedPartitions(levels));
  }
  // Count the exhaustive search first (saturating) to choose the mode.
  double total = 0;
  bool huge_factor = false;
  for (int32_t levels : levels_per_factor) huge_factor = huge_factor || levels > 8;
  for (uint32_t mask = 1; !huge_factor && mask < (1u << f); ++mask) {
    double n = 1;
    for (int32_t k = 0; k < f; ++k)
      if (mask & (1u << k)) n *= static_cast<double>(full[static_cast<size_t>(k)].size());
    total += n;
  }
  const bool exhaustive = !huge_factor && f <= 20 && total <= static_cast<double>(max_candidates);
  c.exhaustive = exhaustive;
  if (exhaustive) {
    for (uint32_t mask = 1; mask < (1u << f); ++mask) {
      std::vector<int32_t> factors;
      for (int32_t k = 0; k < f; ++k)
        if (mask & (1u << k)) factors.push_back(k);
      AppendSplits(factors, full, c.splits, max_candidates);
    }
    return c;
  }
  for (int32_t a = 0; a < f; ++a) AppendSplits({a}, bounded, c.splits, max_candidates);
  for (int32_t a = 0; a < f; ++a)
    for (int32_t b = a + 1; b < f; ++b) AppendSplits({a, b}, bounded, c.splits, max_candidates);
  return c;
}

double SplitDistance(const Split& split, const SplitSample& sample, const std::vector<int32_t>& cell_of) {
  Histograms h;
  PartBuffers buf;
  CellHistograms(sample, cell_of, h);
  return DistanceFromHistograms(split, sample.cells, h, sample.grid, buf);
}

WidestSplit FindWidestSplit(const SplitSample& sample, const std::vector<int32_t>& levels_per_factor,
                            const std::vector<std::vector<int32_t>>& blocks, size_t max_candidates,
                            const PermutationOptions& options) {
  WidestSplit w;
  w.candidates = CandidateSplits(levels_per_factor, max_candidates);
  const auto& splits = w.candidates.splits;
  Histograms h;
  PartBuffers buf;
  CellHistograms(sample, sample.cell, h);
  w.distance = -1;
  for (size_t s = 0; s < splits.size(); ++s) {
    double d = DistanceFromHistograms(splits[s], sample.cells, h, sample.grid, buf);
    if (d > w.distance) {
      w.distance = d;
      w.best = s;
    }
  }
  auto max_distance = [&](const std::vector<int32_t>& cell_of) {
    CellHistograms(sample, cell_of, h);
    double best = 0;
    for (const auto& s : splits) best = std::max(best, DistanceFromHistograms(s, sample.cells, h, sample.grid, buf));
    return best;
  };
  w.test = PermutationTest(sample.cell, blocks, max_distance, Tail::kGreater, options);
  return w;
}

}  // namespace twinprobe::stats
