#include "analysis/listing_reference.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

namespace {

// Three items of factor origin; as read from a store, the most frequent
// level (coastal) comes first.
ListingData ThreeLevels() {
  ListingData d;
  d.item_keys = {"vjx-1", "vjx-2", "vjx-3", "vjx-4"};
  d.factors = {"origin"};
  d.levels = {{"coastal", "upland", "inland"}};
  d.item_level = {{0}, {1}, {2}, {-1}};
  return d;
}

Design WithFactor(const std::string& reference) {
  Design d;
  d.kind = "listing";
  Factor f;
  f.name = "origin";
  f.levels = {"inland", "upland", "coastal"};
  f.reference = reference;
  d.factors = {f};
  return d;
}

}  // namespace

TEST_CASE("issue 24: a listing audit's reference group is the one the design names") {
  const Design design = WithFactor("inland");
  ListingData d = WithListingReference(ThreeLevels(), &design);
  CHECK(d.levels[0] == std::vector<std::string>{"inland", "coastal", "upland"});
  // Every item keeps its level, under the new numbering.
  CHECK(d.item_level == std::vector<std::vector<int32_t>>{{1}, {2}, {0}, {-1}});
}

TEST_CASE("listing reference: without a design, or with a level not stored, the most frequent level stays first") {
  CHECK(WithListingReference(ThreeLevels(), nullptr).levels == ThreeLevels().levels);
  const Design unknown = WithFactor("rural");  // not among the stored levels: nothing to move
  CHECK(WithListingReference(ThreeLevels(), &unknown).levels == ThreeLevels().levels);
  CHECK(WithListingReference(ThreeLevels(), &unknown).item_level == ThreeLevels().item_level);
  Design other = WithFactor("inland");
  other.factors[0].name = "gender";  // a factor the store does not hold
  CHECK(WithListingReference(ThreeLevels(), &other).levels == ThreeLevels().levels);
}
