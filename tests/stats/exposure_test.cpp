#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

#include "stats/exposure.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("exposure: alternating ranks 1..10 give mean exposure 0.5042 vs 0.4045 (log2)") {
  // R 4.2.2: mean(1 / log2(1 + c(1,3,5,7,9))) and the same for {2,4,6,8,10}:
  // under the DCG discount 1/log2(1+j): 0.5042 vs 0.4045, ratio 1.247.
  DiscountSpec log2;
  PositionSummary odd = SummarisePositions({1, 3, 5, 7, 9}, log2, 5);
  PositionSummary even = SummarisePositions({2, 4, 6, 8, 10}, log2, 5);
  CHECK_THAT(odd.exposure_mean, WithinAbs(0.5042, 5e-5));
  CHECK_THAT(even.exposure_mean, WithinAbs(0.4045, 5e-5));
  CHECK_THAT(odd.exposure_mean / even.exposure_mean, WithinAbs(1.247, 5e-4));
  CHECK(odd.in_top_k == 3);
  CHECK(even.in_top_k == 2);
  CHECK(odd.mean_position == 5);
  CHECK(even.median_position == 6);
}

TEST_CASE("exposure: the three discounts at positions 1, 2 and 4") {
  DiscountSpec log2, reciprocal{Discount::kReciprocal}, geometric{Discount::kGeometric, 0.5};
  CHECK(PositionWeight(1, log2) == 1.0);       // 1/log2(2)
  CHECK_THAT(PositionWeight(3, log2), WithinRel(0.5, 1e-15));  // 1/log2(4)
  CHECK(PositionWeight(4, reciprocal) == 0.25);
  CHECK(PositionWeight(1, geometric) == 1.0);
  CHECK(PositionWeight(4, geometric) == 0.125);  // 0.5^3
}

TEST_CASE("exposure: discount names parse and print") {
  DiscountSpec d;
  REQUIRE(ParseDiscount("geometric:0.7", d));
  CHECK(d.kind == Discount::kGeometric);
  CHECK(d.patience == 0.7);
  CHECK(DiscountName(d) == "geometric:0.7");
  CHECK_FALSE(ParseDiscount("geometric:1.5", d));
  CHECK_FALSE(ParseDiscount("dcg", d));
  REQUIRE(ParseDiscount("reciprocal", d));
  CHECK(DiscountName(d) == "reciprocal");
}

TEST_CASE("exposure: median as R's median, NaN when empty") {
  CHECK(Median({3, 1, 2}) == 2);
  CHECK(Median({4, 1, 3, 2}) == 2.5);
  CHECK(std::isnan(Median({})));
  PositionSummary none = SummarisePositions({}, DiscountSpec{}, 10);
  CHECK(none.appearances == 0);
  CHECK(none.exposure_mean == 0);
}
