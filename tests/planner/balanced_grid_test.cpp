#include <catch2/catch.hpp>

#include <algorithm>
#include <map>

#include "planner/balanced_grid.h"

using namespace twinprobe;

namespace {

int64_t Spread(const std::vector<int64_t>& v) {
  auto [lo, hi] = std::minmax_element(v.begin(), v.end());
  return *hi - *lo;
}

}  // namespace

TEST_CASE("balanced grid: rows, columns and cells within one per block, rows and columns within one overall") {
  stats::Rng sizes(99);
  for (int rows = 1; rows <= 6; ++rows)
    for (int cols = 1; cols <= 6; ++cols) {
      stats::Rng rng(static_cast<uint64_t>(rows * 100 + cols));
      BalancedGrid grid(rows, cols);
      for (int block = 0; block < 25; ++block) {
        int64_t n = static_cast<int64_t>(sizes.Below(3 * static_cast<uint64_t>(rows * cols) + 2));
        auto cells = grid.Block(n, rng);
        INFO("rows " << rows << " cols " << cols << " block " << block << " n " << n);
        REQUIRE(static_cast<int64_t>(cells.size()) == n);
        std::vector<int64_t> r(rows, 0), c(cols, 0), rc(static_cast<size_t>(rows * cols), 0);
        for (auto [x, y] : cells) {
          REQUIRE(x >= 0);
          REQUIRE(x < rows);
          REQUIRE(y >= 0);
          REQUIRE(y < cols);
          ++r[x], ++c[y], ++rc[static_cast<size_t>(x * cols + y)];
        }
        CHECK(Spread(r) <= 1);
        CHECK(Spread(c) <= 1);
        CHECK(Spread(rc) <= 1);
        CHECK(Spread(grid.row_uses()) <= 1);
        CHECK(Spread(grid.col_uses()) <= 1);
      }
    }
}

TEST_CASE("balanced grid: the same seed gives the same cells") {
  stats::Rng a(5), b(5);
  BalancedGrid ga(3, 4), gb(3, 4);
  for (int64_t n : {5, 11, 0, 12, 7}) CHECK(ga.Block(n, a) == gb.Block(n, b));
}

TEST_CASE("balanced grid: the extra cells of small blocks are spread at random") {
  // With 2 x 2 and blocks of one, every cell should come up over many blocks.
  stats::Rng rng(3);
  std::map<std::pair<int, int>, int> seen;
  BalancedGrid grid(2, 2);
  for (int i = 0; i < 400; ++i) ++seen[grid.Block(1, rng).front()];
  REQUIRE(seen.size() == 4);
  for (const auto& [cell, n] : seen) CHECK(n > 50);
}
