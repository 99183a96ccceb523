#include <catch2/catch.hpp>

#include <cmath>

#include "stats/rank_compare.h"
#include "stats/wasserstein.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("rank compare: two listings, hand-worked exposure gap and distance") {
  // Listing 1 (positions 1..4): a at 1, 3; b at 2, 4. Listing 2: a at 2; b at 1.
  TwoGroupPositions s;
  s.position = {1, 3, 2, 4, 2, 1};
  s.label = {0, 0, 1, 1, 0, 1};
  s.blocks = {{0, 1, 2, 3}, {4, 5}};
  PermutationOptions none;
  none.resamples = 0;
  GroupComparison c = CompareGroups(s, DiscountSpec{Discount::kReciprocal}, none);
  // a: 1 + 1/3 + 1/2 over 3; b: 1/2 + 1/4 + 1 over 3.
  CHECK_THAT(c.exposure_a, WithinRel((1 + 1.0 / 3 + 0.5) / 3, 1e-15));
  CHECK_THAT(c.exposure_b, WithinRel((0.5 + 0.25 + 1) / 3, 1e-15));
  CHECK_THAT(c.exposure_gap, WithinAbs(c.exposure_a - c.exposure_b, 1e-15));
  CHECK_THAT(c.emd, WithinAbs(Wasserstein1({1, 3, 2}, {2, 4, 1}), 1e-15));
  CHECK(c.mann_whitney.statistic == MannWhitney({1, 3, 2}, {2, 4, 1}).statistic);
  CHECK(c.gap_test.resamples == 0);
}

TEST_CASE("rank compare: a group always on top is detected; a null labelling is not") {
  TwoGroupPositions top, null;
  for (int l = 0; l < 30; ++l) {
    std::vector<int32_t> block;
    for (int p = 1; p <= 10; ++p) {
      int32_t item = static_cast<int32_t>(top.position.size());
      top.position.push_back(p);
      top.label.push_back(p <= 5 ? 0 : 1);  // a holds the top half of every list
      null.position.push_back(p);
      null.label.push_back((p + l) % 2);  // alternating, starting side varies
      block.push_back(item);
    }
    top.blocks.push_back(block);
    null.blocks.push_back(block);
  }
  PermutationOptions o;
  o.resamples = 999;
  o.seed = 3;
  GroupComparison c = CompareGroups(top, DiscountSpec{}, o);
  CHECK(c.exposure_gap > 0);
  CHECK(c.gap_test.p_value == 1.0 / 1000.0);
  CHECK(c.emd_test.p_value == 1.0 / 1000.0);
  CHECK_THAT(c.emd, WithinRel(5.0, 1e-12));  // every a five places above some b
  GroupComparison n = CompareGroups(null, DiscountSpec{}, o);
  CHECK(n.gap_test.p_value > 0.2);
  CHECK(n.emd_test.p_value > 0.2);
}
