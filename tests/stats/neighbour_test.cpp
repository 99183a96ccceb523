#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

#include "stats/neighbour.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinRel;

TEST_CASE("neighbour: cells that differ in exactly one level are neighbours") {
  CHECK(AreNeighbours({0, 1}, {1, 1}));
  CHECK_FALSE(AreNeighbours({0, 1}, {1, 0}));
  CHECK_FALSE(AreNeighbours({0, 1}, {0, 1}));
}

TEST_CASE("neighbour: disparity is the mean distance to the neighbours, worked by hand") {
  // gender (f=0, m=1) x origin (inland=0, coastal=1). Distances chosen so
  // that the coastal women stand out: d(f-coastal, m-coastal) = 4,
  // d(f-coastal, f-inland) = 2, every other neighbour pair 1.
  std::vector<Cell> cells = {{0, 0}, {0, 1}, {1, 0}, {1, 1}};
  auto d = [](size_t a, size_t b) {
    const size_t lo = std::min(a, b), hi = std::max(a, b);
    if (lo == 1 && hi == 3) return 4.0;
    if (lo == 0 && hi == 1) return 2.0;
    return 1.0;
  };
  auto disparity = NeighbourDisparity(cells, d);
  CHECK(disparity[1] == 3.0);    // (2 + 4) / 2
  CHECK(disparity[0] == 1.5);    // (2 + 1) / 2
  CHECK(disparity[3] == 2.5);    // (4 + 1) / 2
  CHECK(disparity[2] == 1.0);
  CHECK(TopK(disparity, 2, true) == std::vector<size_t>{1, 3});
  CHECK(TopK(disparity, 1, false) == std::vector<size_t>{2});
  // A cell without usable neighbours has no disparity.
  auto partial = NeighbourDisparity(cells, d, [](size_t i) { return i != 1 && i != 2; });
  CHECK(std::isnan(partial[0]));
  CHECK(std::isnan(partial[1]));
}

TEST_CASE("neighbour: candidate splits are every grouping of every set of factors") {
  // Two binary factors: split by the first, by the second, by both.
  auto two = CandidateSplits({2, 2}, 1000);
  CHECK(two.exhaustive);
  CHECK(two.splits.size() == 3);
  // Three levels have Bell(3) - 1 = 4 groupings into >= 2 blocks;
  // with a binary factor: 4 + 1 + 4 * 1 = 9 splits.
  auto mixed = CandidateSplits({3, 2}, 1000);
  CHECK(mixed.splits.size() == 9);
  // Five levels: Bell(5) - 1 = 51 groupings.
  CHECK(CandidateSplits({5}, 1000).splits.size() == 51);
  // Bounded: one level against the rest (5) plus all apart (1).
  auto bounded = CandidateSplits({5}, 10);
  CHECK_FALSE(bounded.exhaustive);
  CHECK(bounded.splits.size() == 6);
  const Split& both = two.splits[2];
  CHECK(both.parts == 4);
  CHECK(both.PartOf({1, 0}) == 2);
}

TEST_CASE("neighbour: the widest split finds the factor that orders the list") {
  // Origin decides the order (inland first), gender does not.
  SplitSample s;
  s.cells = {{0, 0}, {0, 1}, {1, 0}, {1, 1}};
  s.grid = 8;
  std::vector<std::vector<int32_t>> blocks;
  for (int l = 0; l < 20; ++l) {
    std::vector<int32_t> block;
    const int32_t order[8] = {0, 2, 0, 2, 1, 3, 1, 3};  // cells by position: inland (origin 0) on top
    for (int p = 0; p < 8; ++p) {
      block.push_back(static_cast<int32_t>(s.position.size()));
      s.position.push_back(p + 1);
      s.cell.push_back(order[(p + l % 2) % 4 + (p >= 4 ? 4 : 0)]);
    }
    blocks.push_back(block);
  }
  PermutationOptions o;
  o.resamples = 499;
  o.seed = 5;
  WidestSplit w = FindWidestSplit(s, {2, 2}, blocks, 100, o);
  const Split& best = w.candidates.splits[w.best];
  REQUIRE(best.factors == std::vector<int32_t>{1});  // origin
  CHECK_THAT(w.distance, WithinRel(4.0, 1e-12));     // inland at 1-4, coastal at 5-8
  CHECK(w.test.p_value == 1.0 / 500.0);
}
