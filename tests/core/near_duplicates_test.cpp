#include "core/near_duplicates.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("near duplicates: case, outer and inner spaces make one key") {
  CHECK(SpellingKey("Harbour Coast") == "harbour coast");
  CHECK(SpellingKey("  harbour   COAST \t") == "harbour coast");
  CHECK(SpellingKey("Harbour-Coast") == "harbour-coast");  // a hyphen is a different value
  CHECK(SpellingKey("") == "");
}

TEST_CASE("near duplicates: spellings are grouped per column, most frequent first, with their counts") {
  SpellingTally tally;
  tally.Add("region", "Harbour Coast");
  tally.Add("region", "North Fen", 4);
  tally.Add("region", "Harbour coast");
  tally.Add("region", "Harbour coast");
  tally.Add("region", "Harbour Coast ");
  tally.Add("employer", "Orlinde Bakery (invented)", 2);
  tally.Add("employer", "orlinde bakery (invented)");
  auto found = tally.NearDuplicates();
  REQUIRE(found.size() == 2);
  CHECK(found[0].column == "region");
  REQUIRE(found[0].spellings.size() == 3);
  CHECK(found[0].spellings[0].text == "Harbour coast");
  CHECK(found[0].spellings[0].count == 2);
  CHECK(found[0].spellings[1].text == "Harbour Coast");  // ties keep the order first seen
  CHECK(found[0].spellings[1].count == 1);
  CHECK(found[0].spellings[2].text == "Harbour Coast ");
  CHECK(found[0].spellings[2].count == 1);
  CHECK(found[1].column == "employer");
  CHECK(found[1].spellings[0].text == "Orlinde Bakery (invented)");
  CHECK(found[1].spellings[0].count == 2);
  CHECK(found[1].spellings[1].text == "orlinde bakery (invented)");
}

TEST_CASE("near duplicates: distinct values and one spelling per value give nothing") {
  SpellingTally tally;
  tally.Add("region", "Upland", 3);
  tally.Add("region", "Uplands");  // a typo is not a near duplicate here (see core/suggest.h)
  tally.Add("occupation", "Upland", 2);  // the same text in another column
  CHECK(tally.NearDuplicates().empty());
}
