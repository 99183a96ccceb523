// [team] in study.toml: the people who may sign in to the desk.
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

}  // namespace

TEST_CASE("desk team: members are read and left out of the canonical text that freeze hashes") {
  auto without = ParseDesign(DemoDesign(), "study.toml", "");
  auto with = ParseDesign(DemoDesign() + "\n[team]\nmembers = [\"Ada Moss\", \"Bo Lind\"]\n", "study.toml", "");
  REQUIRE(without.ok());
  REQUIRE(with.ok());
  CHECK(without.value().team.empty());
  CHECK(with.value().team == std::vector<std::string>{"Ada Moss", "Bo Lind"});
  CHECK(with.value().canonical == without.value().canonical);
}

TEST_CASE("desk team: an unusable, repeated or unknown entry names its place in study.toml") {
  const std::string base = DemoDesign() + "\n[team]\n";
  const int line = static_cast<int>(std::count(base.begin(), base.end(), '\n')) + 1;
  auto at = [&](int col) { return "study.toml:" + std::to_string(line) + ":" + std::to_string(col) + ": "; };
  CHECK(ParseDesign(base + "members = [\"Ada Moss\", \" Bo\"]\n", "study.toml", "").error().Message() ==
        at(24) +
            "[team].members holds ' Bo', which is not a usable name \u2014 write each member as 1 to 60 printable "
            "characters without leading or trailing spaces");
  CHECK(ParseDesign(base + "members = [\"Ada Moss\", \"Ada Moss\"]\n", "study.toml", "").error().Message() ==
        at(24) + "[team].members lists 'Ada Moss' twice \u2014 remove the duplicate");
  CHECK(ParseDesign(base + "members = []\n", "study.toml", "").error().Message() ==
        at(11) + "[team].members is empty \u2014 name at least one member, or leave out [team]");
  CHECK(ParseDesign(base + "member = [\"Ada Moss\"]\n", "study.toml", "").error().Message() ==
        at(10) + "unknown key 'member' in [team] (did you mean 'members'?) \u2014 the keys allowed here are: members");
}
