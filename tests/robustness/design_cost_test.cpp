// Issue 23: a design's cost is bounded before it is spent. Twenty two-level
// factors with include = "all" drove `check` to 12 GB after 15 minutes while
// it built 1,048,576 arms; now the arms are counted first and the design is
// refused at once. The peak memory is asserted in a child process
// (getrusage via wait4), as in html_cost_test.cpp.
#include <catch2/catch.hpp>

#include <chrono>
#include <regex>
#include <string>

#include "planner/design_file.h"
#include "testing/testing.h"
#include "robustness/peak_memory.h"

using namespace twinprobe;
using testing::PeakKbInChild;

namespace {

// The robustness fixture's design with `factors` two-level factors (the
// first one, origin, keeps its name pools) and the given [arms] section.
std::string DesignWith(int factors, const std::string& arms) {
  std::string text = testing::ReadFile(testing::SourceDir() + "/tests/robustness/fixture_study/study.toml");
  text = std::regex_replace(text, std::regex("kind = \"paired\""), "kind = \"sets\"");
  std::string more;
  for (int i = 2; i <= factors; ++i)
    more += "[[factor]]\nname = \"f" + std::to_string(i) + "\"\nlevels = [\"a\", \"b\"]\n\n";
  text = std::regex_replace(text, std::regex("\\[arms\\]\ninclude = \"all\"\n"), more + arms);
  return text;
}

constexpr long kBoundKb = 150 * 1024;

}  // namespace

TEST_CASE("issue 23: 20 two-level factors with include all are refused at once, under 150 MB") {
  const std::string text = DesignWith(20, "[arms]\ninclude = \"all\"\n");
  const std::string dir = testing::SourceDir() + "/tests/robustness/fixture_study";
  auto start = std::chrono::steady_clock::now();
  auto d = ParseDesign(text, "study.toml", dir);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what ==
        "the design would have over 100000 arms (every combination of 20 factors' levels), more than the 100 a "
        "study may have");
  CHECK(d.error().fix ==
        "use include = \"neighbours\" (the reference arm and one change at a time) or list the arms with [arms].list");
  CHECK(seconds < 1.0);
  const long kb = PeakKbInChild([&] { return !ParseDesign(text, "study.toml", dir).ok(); });
  INFO("peak " << kb << " KB");
  CHECK(kb > 0);
  CHECK(kb < kBoundKb);
}

TEST_CASE("issue 23: the same 20 factors with include neighbours (21 arms) pass the arms bound") {
  const std::string dir = testing::SourceDir() + "/tests/robustness/fixture_study";
  auto d = ParseDesign(DesignWith(20, "[arms]\ninclude = \"neighbours\"\n"), "study.toml", dir);
  REQUIRE_FALSE(d.ok());
  // The next rule stops it (the invented factors change no application),
  // not the bound: 1 + 20 x (2 - 1) = 21 arms; 101 factors make 102.
  CHECK(d.error().Message() ==
        "study.toml:17:1: factor 'f2' changes nothing in the applications: no name pool is keyed by it and it sets "
        "no template field \u2014 add fields = { \u2026 } to its [[factor]], or key the name pools by it");
  auto many = ParseDesign(DesignWith(101, "[arms]\ninclude = \"neighbours\"\n"), "study.toml", dir);
  REQUIRE_FALSE(many.ok());
  CHECK(many.error().what ==
        "the design would have 102 arms (the reference arm and one change at a time over 101 factors' levels), more "
        "than the 100 a study may have");
}

TEST_CASE("issue 23: 7 two-level factors with include all (128 arms) are refused with the exact count") {
  const std::string dir = testing::SourceDir() + "/tests/robustness/fixture_study";
  auto d = ParseDesign(DesignWith(7, "[arms]\ninclude = \"all\"\n"), "study.toml", dir);
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().Message().find("the design would have 128 arms (every combination of 7 factors' levels), more than "
                                 "the 100 a study may have") != std::string::npos);
}
