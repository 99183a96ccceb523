#include <catch2/catch.hpp>

#include "planner/design_file.h"
#include "templates/embedded.h"

using namespace twinprobe;

namespace {

std::string DemoDesign() {
  for (const auto& f : DemoStudyFiles())
    if (f.path == "study.toml") return std::string(f.content);
  return {};
}

std::string Replace(std::string s, const std::string& from, const std::string& to) {
  auto pos = s.find(from);
  REQUIRE(pos != std::string::npos);
  return s.replace(pos, from.size(), to);
}

}  // namespace

TEST_CASE("design: the demo design parses with its arms and reference") {
  auto d = ParseDesign(DemoDesign(), "study.toml", "");
  REQUIRE(d.ok());
  const Design& design = d.value();
  CHECK(design.study_id == "veldmark-callbacks-demo");
  REQUIRE(design.arms.size() == 2);
  CHECK(design.arms[design.reference_arm].label == "origin=inland");
  CHECK(design.outcomes.is_positive("invitation"));
  CHECK_FALSE(design.outcomes.is_positive("rejection"));
  CHECK(design.strata == std::vector<std::string>{"occupation", "region"});
  CHECK(design.ethics.decline_within_hours == 24);
}

TEST_CASE("design: the canonical form ignores comments and layout") {
  auto a = ParseDesign(DemoDesign(), "study.toml", "");
  auto b = ParseDesign("# a new comment\n" + DemoDesign(), "study.toml", "");
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  CHECK(a.value().canonical == b.value().canonical);
}

TEST_CASE("design: a TOML syntax error points at line and column") {
  auto d = ParseDesign("[study]\nid = \"x\"\nseed = = 3\n", "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().where == "study.toml:3:8");
}

TEST_CASE("design: a misspelt key is named with a suggestion") {
  auto d = ParseDesign(Replace(DemoDesign(), "window_days = 28", "windwo_days = 28"), "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "unknown key 'windwo_days' in [outcomes] (did you mean 'window_days'?)");
}

TEST_CASE("design: an arm naming an unknown factor is refused") {
  std::string text = Replace(DemoDesign(), "include = \"all\"", "list = [{origin = \"inland\"}, {orgin = \"coastal\"}]");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "arm names unknown factor 'orgin' (did you mean 'origin'?)");
}

TEST_CASE("design: a level without a name pool is refused") {
  std::string text = Replace(DemoDesign(), "[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"coastal\"\nfile = \"names/coastal.csv\"",
                             "");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "level 'coastal' of factor 'origin' has no name pool");
}

TEST_CASE("design: a reversed gap range is refused with its position") {
  auto d = ParseDesign(Replace(DemoDesign(), "gap_hours = [24, 72]", "gap_hours = [72, 24]"), "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "[schedule].gap_hours is reversed: min 72 > max 24");
  CHECK(d.error().where.rfind("study.toml:", 0) == 0);
}
