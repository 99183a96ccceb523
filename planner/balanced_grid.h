#pragma once
// Restricted randomisation over a grid of rows x columns (e.g. template
// offset x send-order row, or arm x template), block by block.
//
// Contract of Block(n): it returns n cells such that, within the block,
//   - every row is used floor(n/R) or ceil(n/R) times,
//   - every column floor(n/C) or ceil(n/C) times,
//   - every cell floor(n/RC) or ceil(n/RC) times;
// and, over all blocks drawn from one grid so far, the row totals differ by
// at most one and so do the column totals (the extra uses of a block go to
// the rows and columns used least so far, ties broken at random).
//
// How: a block holds floor(n/RC) copies of the whole grid plus a remainder of
// m < RC distinct cells taken in the order
//   i -> (i mod R, (i + floor(i / L)) mod C),  L = lcm(R, C),
// which visits every cell once in RC steps and keeps both margins within one
// on every prefix. Rows and columns are then relabelled so the prefix's extra
// uses land on the least-used ones. The caller shuffles the cells over the
// block's units.
#include <cstdint>
#include <utility>
#include <vector>

#include "stats/random.h"

namespace twinprobe {

class BalancedGrid {
 public:
  BalancedGrid(int rows, int cols);  // rows, cols >= 1

  // The cells (row, column) for one block of n >= 0 units, in no useful order.
  std::vector<std::pair<int, int>> Block(int64_t n, stats::Rng& rng);

  const std::vector<int64_t>& row_uses() const { return row_use_; }
  const std::vector<int64_t>& col_uses() const { return col_use_; }

 private:
  int rows_, cols_;
  std::vector<int64_t> row_use_, col_use_;
};

}  // namespace twinprobe
