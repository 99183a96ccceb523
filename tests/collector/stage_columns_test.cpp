// One yes/no column per hiring stage (collector/stage_columns.h).
#include <catch2/catch.hpp>

#include "collector/stage_columns.h"

using namespace twinprobe;

namespace {

const std::vector<std::string> kStages = {"applied", "screened", "interview"};
const std::vector<int> kColumns = {2, 3, 4};

CsvRecord Row(std::vector<std::string> flags) {
  CsvRecord r;
  r.line = 7;
  r.fields = {"REQ-1", "a"};
  r.fields.insert(r.fields.end(), flags.begin(), flags.end());
  return r;
}

}  // namespace

TEST_CASE("stage columns: every spelling of yes and no, in any case, reads as one rule") {
  for (const char* yes : {"1", "yes", "Yes", "Y", "true", "TRUE", " yes "}) CHECK(StageFlag(yes) == std::optional<bool>(true));
  for (const char* no : {"0", "no", "No", "n", "false", "False"}) CHECK(StageFlag(no) == std::optional<bool>(false));
  for (const char* neither : {"", "2", "maybe", "yes!"}) CHECK_FALSE(StageFlag(neither).has_value());
}

TEST_CASE("stage columns: the furthest stage is the last one flagged yes") {
  CHECK(FurthestStage(Row({"yes", "no", "no"}), kColumns, kStages, "hr.csv").value() == 0);
  CHECK(FurthestStage(Row({"1", "1", "0"}), kColumns, kStages, "hr.csv").value() == 1);
  CHECK(FurthestStage(Row({"true", "Y", "yes"}), kColumns, kStages, "hr.csv").value() == 2);
}

TEST_CASE("stage columns: a stage passed without the one before it is refused at the earlier cell") {
  auto r = FurthestStage(Row({"yes", "no", "yes"}), kColumns, kStages, "hr.csv");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().where == "hr.csv:7:4");
  CHECK(r.error().what == "the application reached 'interview' but not 'screened' before it");
}

TEST_CASE("stage columns: no stage reached, or a cell neither yes nor no, is refused with its column") {
  auto none = FurthestStage(Row({"no", "no", "no"}), kColumns, kStages, "hr.csv");
  REQUIRE_FALSE(none.ok());
  CHECK(none.error().where == "hr.csv:7:3");
  CHECK(none.error().what == "the application reached no stage, not even 'applied'");
  auto empty = FurthestStage(Row({"yes", "", "no"}), kColumns, kStages, "hr.csv");
  REQUIRE_FALSE(empty.ok());
  CHECK(empty.error().where == "hr.csv:7:4");
  CHECK(empty.error().what == "the stage 'screened' holds '', not yes or no");
}
