// Materials belong to one plan (issue 16, "what was seen" 3): after render, a
// shorter vacancies.csv and a new plan, materials/P00001.md still held the
// old plan's profile while schedule listed P00001 as the other arm, and
// `sent P00001` was accepted. A field worker would have sent the wrong arm.
#include <catch2/catch.hpp>

#include <filesystem>

#include <nlohmann/json.hpp>

#include "testing/pinned_clock.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

struct Study {
  testing::PinnedClock clock;  // the season's end: fieldwork times may not lie in the future
  testing::TempDir dir;
  std::string study;
  Study() : study(dir / "s") { REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0); }
  testing::CliRun Run(std::vector<std::string> args) const {
    args.insert(args.begin(), {"--study", study});
    return RunCli(args);
  }
  // Keeps the header and the first `keep` vacancies.
  void CutVacancies(size_t keep) const {
    std::string text = testing::ReadFile(study + "/vacancies.csv");
    size_t pos = 0;
    for (size_t line = 0; line <= keep; ++line) pos = text.find('\n', pos) + 1;
    testing::WriteFile(study + "/vacancies.csv", text.substr(0, pos));
  }
};

const std::string kDash = " \u2014 ";

}  // namespace

TEST_CASE("materials: a new plan moves the old plan's materials aside and sent refuses until render") {
  Study s;
  REQUIRE(s.Run({"plan"}).exit_code == 0);
  REQUIRE(s.Run({"render"}).exit_code == 0);
  std::string old_md = testing::ReadFile(s.study + "/materials/P00001.md");
  s.CutVacancies(200);
  auto replan = s.Run({"plan"});
  INFO(replan.err);
  REQUIRE(replan.exit_code == 0);
  CHECK(replan.out.find("Moved the materials of plan 1 (2401 files) to " + s.study +
                        "/materials/superseded-plan-1: they do not belong to plan 2; run 'twinprobe render' before "
                        "sending.\n") != std::string::npos);
  CHECK(testing::ReadFile(s.study + "/materials/superseded-plan-1/P00001.md") == old_md);
  CHECK(!std::filesystem::exists(s.study + "/materials/P00001.md"));

  auto sent = s.Run({"sent", "P00001", "--at", "2027-03-01T09:00"});
  CHECK(sent.exit_code == 1);
  CHECK(sent.err == "twinprobe: " + s.study + "/materials/P00001.md: probe P00001 has no material rendered for plan 2 "
                    "(the last render was for plan 1)" + kDash +
                    "run 'twinprobe render' to write this plan's materials, then send\n");
  auto schedule = s.Run({"schedule"});
  CHECK(schedule.exit_code == 1);
  // The first probe of the new plan's send order (planned-time order, not
  // reference order) is the one named.
  CHECK(schedule.err == "twinprobe: " + s.study + "/materials/P00017.md: probe P00017 has no material rendered for plan "
                        "2 (the last render was for plan 1)" + kDash +
                        "run 'twinprobe render' to write this plan's materials, then send\n");

  REQUIRE(s.Run({"render"}).exit_code == 0);
  CHECK(s.Run({"schedule"}).exit_code == 0);
  // A file changed after render is not what the store sealed.
  testing::WriteFile(s.study + "/materials/P00001.md", old_md);
  auto changed = s.Run({"sent", "P00001", "--at", "2027-03-01T09:00"});
  CHECK(changed.exit_code == 1);
  CHECK(changed.err == "twinprobe: " + s.study + "/materials/P00001.md: the file differs from the one rendered for "
                       "probe P00001 of plan 2 (its SHA-256 is not the sealed one)" + kDash +
                       "run 'twinprobe render --probe P00001' to write it again, then send\n");
  REQUIRE(s.Run({"render", "--probe", "P00001"}).exit_code == 0);
  auto ok = s.Run({"sent", "P00001", "--at", "2027-03-01T09:00"});
  INFO(ok.err);
  CHECK(ok.exit_code == 0);
}

TEST_CASE("materials: render seals the plan and every file's SHA-256, so the store proves what was sent") {
  Study s;
  REQUIRE(s.Run({"plan"}).exit_code == 0);
  auto r = s.Run({"--json", "render", "--probe", "P00001"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["plan_id"] == 1);
  CHECK(j["audit_head"].get<std::string>().size() == 64);
  std::string manifest = testing::ReadFile(s.study + "/materials/manifest.csv");
  CHECK(manifest.rfind("plan,probe,vacancy,arm,", 0) == 0);
  CHECK(manifest.find("\n1,P00001,V0001,") != std::string::npos);
  auto verify = s.Run({"verify"});
  INFO(verify.out + verify.err);
  CHECK(verify.exit_code == 0);
}

TEST_CASE("materials: a study never rendered sends without materials") {
  // Studies that send by other means (or import their data) have no
  // materials to compare; only a render makes the check apply.
  Study s;
  REQUIRE(s.Run({"plan"}).exit_code == 0);
  CHECK(s.Run({"sent", "P00001", "--at", "2027-03-01T09:00"}).exit_code == 0);
}
