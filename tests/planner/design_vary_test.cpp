// The design file's keys for designs beyond one within factor: vary,
// label, labels and scores of a [[factor]], and the rules they bring
// (tests/planner/age_study.h is the study they are tried on).
#include <catch2/catch.hpp>

#include "planner/age_study.h"
#include "planner/design_file.h"

using namespace twinprobe;

namespace {

std::string Replace(std::string s, const std::string& from, const std::string& to) {
  auto pos = s.find(from);
  REQUIRE(pos != std::string::npos);
  return s.replace(pos, from.size(), to);
}

Error Refusal(const std::string& toml) {
  auto d = ParseDesign(toml, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  return d.error();
}

}  // namespace

TEST_CASE("design vary: the age study parses with six arms, gender between, three arms per vacancy") {
  auto d = ParseDesign(testing::AgeStudyToml(), "study.toml", "");
  INFO((d.ok() ? "" : d.error().Message()));
  REQUIRE(d.ok());
  CHECK(d.value().arms.size() == 6);
  CHECK(d.value().factors[0].vary == "within");
  CHECK(d.value().factors[1].vary == "between");
  CHECK(d.value().arms[static_cast<size_t>(d.value().reference_arm)].label == "age=28,gender=f");
}

TEST_CASE("design vary: an unknown vary is refused with a suggestion") {
  Error e = Refusal(Replace(testing::AgeStudyToml(), "vary = \"between\"", "vary = \"betwen\""));
  CHECK(e.where == "study.toml:19:8");
  CHECK(e.what == "[[factor]].vary of 'gender' must be \"within\" or \"between\", got 'betwen' (did you mean 'between'?)");
  CHECK(e.fix == "write vary = \"within\" (each vacancy receives every level) or vary = \"between\" (each vacancy one level)");
}

TEST_CASE("design vary: every factor between leaves nothing to compare within a vacancy") {
  Error e = Refusal(Replace(testing::AgeStudyToml(), "name = \"age\"\n", "name = \"age\"\nvary = \"between\"\n"));
  CHECK(e.where == "study.toml:8:1");
  CHECK(e.what == "every factor varies between vacancies, so each vacancy of this sets study would receive one probe and "
                  "no set would compare anything");
  CHECK(e.fix == "let the attribute under test vary within vacancies (vary = \"within\"), or use kind = \"unpaired\"");
}

TEST_CASE("design vary: between levels that would receive different within arms are refused") {
  Error e = Refusal(Replace(testing::AgeStudyToml(), "include = \"all\"",
                            "list = [{age = \"28\", gender = \"f\"}, {age = \"45\", gender = \"f\"}, {age = \"58\", gender "
                            "= \"f\"}, {age = \"28\", gender = \"m\"}, {age = \"45\", gender = \"m\"}]"));
  CHECK(e.where == "study.toml");
  CHECK(e.what == "the vacancies that receive gender=m would not receive the same arms as the others (missing: age=58)");
  CHECK(e.fix == "give every level of a between factor the same arms of the within factors: use include = \"all\" or "
                 "list the missing arms in [arms].list");
}

TEST_CASE("design vary: a paired study needs two arms per vacancy") {
  Error e = Refusal(Replace(testing::AgeStudyToml(), "kind = \"sets\"", "kind = \"paired\""));
  CHECK(e.where == "study.toml:8:1");
  CHECK(e.what == "a paired study needs two arms per vacancy, this design gives each vacancy 3");
  CHECK(e.fix == "use kind = \"sets\" for more arms per vacancy");
}

TEST_CASE("design vary: templates are counted per vacancy, not per arm") {
  Error e = Refusal(Replace(testing::AgeStudyToml(), "files = [\"templates/cv_a.md\", \"templates/cv_b.md\", \"templates/cv_c.md\"]",
                            "files = [\"templates/cv_a.md\", \"templates/cv_b.md\"]"));
  CHECK(e.what == "a sets study with 3 arms per vacancy needs at least 3 templates, so no two probes of one set share one");
}

TEST_CASE("design vary: labels must name levels and scores must give one distinct number per level") {
  Error unknown = Refusal(Replace(testing::AgeStudyToml(), "\"58\" = \"aged 58\"", "\"59\" = \"aged 59\""));
  CHECK(unknown.where == "study.toml:14:55");
  CHECK(unknown.what == "labels names '59', which is not a level of 'age' (did you mean '58'?)");
  Error count = Refusal(Replace(testing::AgeStudyToml(), "scores = [28, 45, 58]", "scores = [28, 45]"));
  CHECK(count.where == "study.toml:13:10");
  CHECK(count.what == "[[factor]].scores of 'age' must list 3 numbers, one per level in the order of levels");
  CHECK(count.fix == "write scores = [28, 45, 58] beside levels (a score says where an ordered level lies)");
  Error text = Refusal(Replace(testing::AgeStudyToml(), "scores = [28, 45, 58]", "scores = [28, \"45\", 58]"));
  CHECK(text.what == count.what);
  Error same = Refusal(Replace(testing::AgeStudyToml(), "scores = [28, 45, 58]", "scores = [28, 45, 45.0]"));
  CHECK(same.where == "study.toml:13:19");
  CHECK(same.what == "levels '45' and '58' of 'age' have the same score, so the trend test could not order them");
  Error empty = Refusal(Replace(testing::AgeStudyToml(), "\"f\" = \"woman\"", "\"f\" = \"\""));
  CHECK(empty.what == "the label of level 'f' must be a text in quotes, not empty");
}

TEST_CASE("design vary: looks in a paired design with a between factor are refused, naming why (issue 20, item 4)") {
  // Two probes per vacancy but four arms: monitor's McNemar test covers none of it.
  std::string toml = Replace(testing::AgeStudyToml(), "kind = \"sets\"", "kind = \"paired\"");
  toml = Replace(toml, "levels = [\"28\", \"45\", \"58\"]", "levels = [\"28\", \"58\"]");
  toml = Replace(toml, "scores = [28, 45, 58]", "scores = [28, 58]");
  toml = Replace(toml, "labels = { \"28\" = \"aged 28\", \"45\" = \"aged 45\", \"58\" = \"aged 58\" }",
                 "labels = { \"28\" = \"aged 28\", \"58\" = \"aged 58\" }");
  toml = Replace(toml, "birth_year = [\"1999\", \"1982\", \"1969\"], graduation_year = [\"2020\", \"2003\", \"1990\"]",
                 "birth_year = [\"1999\", \"1969\"], graduation_year = [\"2020\", \"1990\"]");
  auto without_looks = ParseDesign(toml, "study.toml", "");
  INFO((without_looks.ok() ? "" : without_looks.error().Message()));
  REQUIRE(without_looks.ok());
  Error e = Refusal(toml + "\n[analysis]\nlooks = [150]\n");
  CHECK(e.where == "study.toml:61:9");
  CHECK(e.what == "[analysis].looks plans interim looks, but monitor can only watch a paired design (two arms, a set of "
                  "two probes per vacancy) and this design has 4 arms, because factor 'gender' varies between vacancies");
  CHECK(e.fix == "remove looks and analyse once at the end of fieldwork with 'twinprobe analyze'");
}
