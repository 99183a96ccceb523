#include <catch2/catch.hpp>

#include "planner/study_check.h"

using namespace twinprobe;

TEST_CASE("study check: a listing audit has nothing to plan") {
  CheckedStudy s;
  s.design.kind = "listing";
  auto proof = ProveStudy("veldmark", s);
  REQUIRE_FALSE(proof.ok());
  CHECK(proof.error().Message() ==
        "veldmark/study.toml: a listing audit (kind = \"listing\") sends no probes, so there is nothing to plan \u2014 "
        "collect its listings with 'twinprobe fetch'");
}
