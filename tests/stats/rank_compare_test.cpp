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
  s.label = {0, 0, 1, 1, 0, 1};  // no units: each place is its own unit
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

TEST_CASE("rank compare: an item shown in two lists keeps one label under permutation") {
  // Stratum of 4 items shown twice (two fetches): places 0-3 and 4-7 show
  // items 0,1,2,3 and 1,0,3,2. Units are the items.
  TwoGroupPositions s;
  s.position = {1, 2, 3, 4, 1, 2, 3, 4};
  s.unit = {0, 1, 2, 3, 1, 0, 3, 2};
  s.label = {0, 0, 1, 1};
  s.blocks = {{0, 1, 2, 3}};
  std::vector<double> w(8);
  for (size_t i = 0; i < 8; ++i) w[i] = PositionWeight(s.position[i], DiscountSpec{Discount::kReciprocal});
  // Items 0 and 1 sit at places 1 and 2 in both lists, items 2 and 3 at 3
  // and 4: a's places weigh (1 + 1/2) * 2 / 4 = 0.75, b's (1/3 + 1/4) * 2 / 4.
  const double observed = 0.75 - 7.0 / 24.0;
  CHECK_THAT(ExposureGap(w, s.unit, s.label), WithinAbs(observed, 1e-15));
  // Of the 6 ways to give 2 of the 4 items label a, only {0,1} and {2,3}
  // reach |gap| = observed: the exact permutation p is 2/6 when units are
  // items. (Shuffling places independently would break the pairing.)
  int extreme = 0;
  std::vector<std::vector<int32_t>> labellings = {{0, 0, 1, 1}, {0, 1, 0, 1}, {0, 1, 1, 0},
                                                  {1, 0, 0, 1}, {1, 0, 1, 0}, {1, 1, 0, 0}};
  for (const auto& l : labellings) extreme += std::fabs(ExposureGap(w, s.unit, l)) >= observed - 1e-12;
  REQUIRE(extreme == 2);
  PermutationOptions o;
  o.resamples = 20000;
  GroupComparison c = CompareGroups(s, DiscountSpec{Discount::kReciprocal}, o);
  const double exact = 2.0 / 6.0;
  CHECK(std::fabs(c.gap_test.p_value - exact) < 4 * std::sqrt(exact * (1 - exact) / 20000.0));
  CHECK(c.n_a == 4);
  CHECK(c.n_b == 4);
}

TEST_CASE("rank compare: a group always on top is detected, a null labelling is not") {
  TwoGroupPositions top, null;
  for (int l = 0; l < 30; ++l) {
    std::vector<int32_t> block;
    for (int p = 1; p <= 10; ++p) {
      int32_t item = static_cast<int32_t>(top.position.size());  // a new item in every place
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
