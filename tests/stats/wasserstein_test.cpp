#include <catch2/catch.hpp>

#include <vector>

#include "stats/wasserstein.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("wasserstein: scipy's documented examples") {
  // scipy.stats.wasserstein_distance docstring examples: 5.0, 0.25 and
  // 4.0781331438 (recomputed with scipy 1.10.1 in
  // tests/reference/ranks/fixtures.json).
  CHECK_THAT(Wasserstein1({0, 1, 3}, {5, 6, 8}), WithinRel(5.0, 1e-15));
  CHECK_THAT(Wasserstein1({0, 1}, {0, 1}, {3, 1}, {2, 2}), WithinRel(0.25, 1e-15));
  CHECK_THAT(Wasserstein1({3.4, 3.9, 7.5, 7.8}, {4.5, 1.4}, {1.4, 0.9, 3.1, 7.2}, {3.2, 3.5}),
             WithinRel(4.0781331438, 1e-10));
}

TEST_CASE("wasserstein: hand-worked, a shift of every point moves the distance by the shift") {
  // Each unit of mass moves 2.5 to the right: W1 = 2.5 (definition).
  CHECK_THAT(Wasserstein1({1, 2, 7}, {3.5, 4.5, 9.5}), WithinRel(2.5, 1e-15));
  CHECK(Wasserstein1({4, 1, 2}, {1, 2, 4}) == 0);
}

TEST_CASE("wasserstein: the grid and the split forms agree with the sample form") {
  // Positions in a list of 6: u at 1,1,2,5 and v at 2,3,6.
  std::vector<double> u = {1, 1, 2, 5}, v = {2, 3, 6};
  double direct = Wasserstein1(u, v);
  CHECK_THAT(Wasserstein1OnGrid({2, 1, 0, 0, 1, 0}, {0, 1, 1, 0, 0, 1}), WithinAbs(direct, 1e-15));
  // Pooled and sorted: 1u 1u 2u 2v 3v 5u 6v.
  CHECK_THAT(Wasserstein1Split({1, 1, 2, 2, 3, 5, 6}, {1, 1, 1, 0, 0, 1, 0}), WithinAbs(direct, 1e-15));
  // Hand-worked: F_u - F_v on [1,2): 1/2 - 0, [2,3): 3/4 - 1/3, [3,5): 3/4 - 2/3,
  // [5,6): 1 - 2/3 -> 1/2 + 5/12 + 2/12 + 1/3 = 17/12.
  CHECK_THAT(direct, WithinRel(17.0 / 12.0, 1e-15));
}

TEST_CASE("wasserstein: bad input is named") {
  CHECK(CheckWassersteinInput({}, {1}, {}, {}) == "the sample u is empty");
  CHECK(CheckWassersteinInput({1}, {1, 2}, {}, {1}) == "the sample v has 2 values but 1 weights");
  CHECK(CheckWassersteinInput({1}, {2}, {-1}, {}) == "the weights of u must be finite and non-negative");
  CHECK(CheckWassersteinInput({1}, {2}, {0}, {}) == "the weights of u must have a positive, finite sum");
  CHECK(CheckWassersteinInput({1, 2}, {3}, {}, {}).empty());
}
