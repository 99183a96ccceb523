#include <catch2/catch.hpp>

#include "stats/rank_overlap.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinRel;

TEST_CASE("rank overlap: Jaccard distance of two result lists, worked by hand") {
  // {a,b,c,d} and {b,c,e}: intersection 2, union 5 -> J = 0.4, distance 0.6.
  CHECK_THAT(JaccardDistance({"a", "b", "c", "d"}, {"e", "c", "b"}), WithinRel(0.6, 1e-15));
  CHECK(JaccardDistance({"a", "b"}, {"b", "a", "a"}) == 0.0);
  CHECK(JaccardDistance({"a"}, {"b"}) == 1.0);
  CHECK(JaccardDistance({}, {}) == 0.0);
}
