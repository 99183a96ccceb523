#include "planner/balanced_grid.h"

#include <algorithm>
#include <numeric>

namespace twinprobe {
namespace {

// Labels sorted by use, least used first; ties in a random order.
std::vector<int> LeastUsedFirst(const std::vector<int64_t>& use, stats::Rng& rng) {
  std::vector<int> labels(use.size());
  std::iota(labels.begin(), labels.end(), 0);
  rng.Shuffle(labels);
  std::stable_sort(labels.begin(), labels.end(), [&](int a, int b) { return use[a] < use[b]; });
  return labels;
}

}  // namespace

BalancedGrid::BalancedGrid(int rows, int cols)
    : rows_(rows), cols_(cols), row_use_(rows, 0), col_use_(cols, 0) {}

std::vector<std::pair<int, int>> BalancedGrid::Block(int64_t n, stats::Rng& rng) {
  const int64_t R = rows_, C = cols_, RC = R * C, L = std::lcm(R, C);
  const int64_t full = n / RC, m = n % RC;

  // Enumeration labels that get one use more than the others in the remainder.
  // Rows: i mod R over i < m, so rows 0 .. (m mod R) - 1.
  // Columns: whole L-chunks are even; the last partial chunk (shift q = m / L)
  // covers columns q, q+1, … (mod C), so those come first.
  const int64_t q = m / L;
  std::vector<int> enum_cols(C);
  for (int64_t j = 0; j < C; ++j) enum_cols[j] = static_cast<int>((q + j) % C);

  std::vector<int> row_of(R), col_of(C);  // enumeration label -> actual label
  std::vector<int> rows_by_use = LeastUsedFirst(row_use_, rng);
  std::vector<int> cols_by_use = LeastUsedFirst(col_use_, rng);
  for (int64_t x = 0; x < R; ++x) row_of[x] = rows_by_use[x];
  for (int64_t j = 0; j < C; ++j) col_of[enum_cols[j]] = cols_by_use[j];

  std::vector<std::pair<int, int>> cells;
  cells.reserve(static_cast<size_t>(n));
  for (int64_t f = 0; f < full; ++f)
    for (int r = 0; r < R; ++r)
      for (int c = 0; c < C; ++c) cells.emplace_back(r, c);
  for (int64_t i = 0; i < m; ++i)
    cells.emplace_back(row_of[i % R], col_of[(i + i / L) % C]);
  for (auto& [r, c] : cells) ++row_use_[r], ++col_use_[c];
  return cells;
}

}  // namespace twinprobe
