#include "core/level_labels.h"

#include <catch2/catch.hpp>

#include "core/design.h"
#include "core/read_design.h"

using namespace twinprobe;

TEST_CASE("level labels: a level shows its label, else itself") {
  const LevelLabels labels{{"28", "aged 28"}, {"45", ""}};
  CHECK(LevelDisplay(labels, "28") == "aged 28");
  CHECK(LevelDisplay(labels, "45") == "45");  // an empty label is no label
  CHECK(LevelDisplay(labels, "58") == "58");
  CHECK(LevelLabelsOf({"28", "45", "58"}, {"aged 28", "", "aged 58"}) ==
        LevelLabels{{"28", "aged 28"}, {"58", "aged 58"}});
}

TEST_CASE("level labels: an arm label shows each level's label in the label's order") {
  const std::map<std::string, LevelLabels> by_factor{{"age", {{"28", "aged 28"}}}, {"gender", {{"f", "woman"}}}};
  CHECK(ArmDisplay("age=28,gender=f", by_factor) == "aged 28, woman");
  CHECK(ArmDisplay("age=45,gender=f", by_factor) == "45, woman");
  CHECK(ArmDisplay("origin=coastal", by_factor) == "coastal");  // a factor without labels
  CHECK(ArmDisplay("inland", by_factor) == "inland");           // no '=': as it is
  CHECK(ArmDisplay("", by_factor) == "");
}

TEST_CASE("level labels: the design file's and the store's factors follow the one rule") {
  Factor designed;
  designed.name = "age";
  designed.levels = {"28", "45"};
  designed.labels = {{"28", "aged 28"}};
  StoredFactor stored;
  stored.name = "age";
  stored.levels = {"28", "45"};
  stored.level_labels = {"aged 28", ""};
  for (const std::string level : {"28", "45", "58"}) {
    INFO(level);
    CHECK(designed.LevelLabel(level) == stored.LevelLabel(level));
  }
  CHECK(designed.LevelLabel("28") == "aged 28");
}
