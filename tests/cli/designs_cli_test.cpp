// check, plan and freeze on the 3-level ordered age study with gender
// assigned between vacancies (tests/planner/age_study.h; docs/designs.md
// shows the same runs).
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "planner/age_study.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

struct AgeStudyFolder {
  testing::TempDir dir;
  std::string study = dir / "age";
  AgeStudyFolder() { testing::WriteAgeStudy(study); }
  testing::CliRun Run(std::vector<std::string> args) const {
    args.insert(args.begin(), {"--study", study});
    return RunCli(args, {"TWINPROBE_NOW=2027-04-26T14:59:00Z"});
  }
};

}  // namespace

TEST_CASE("cli designs: check explains how each factor varies") {
  AgeStudyFolder s;
  auto r = s.Run({"check"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out ==
        "Design ostervale-age-study is valid: sets design, 6 arms, 48 vacancies, 3 templates.\n"
        "Factors: age (years) (age) varies within each vacancy (3 levels: aged 28, aged 45, aged 58); gender is "
        "assigned between vacancies (2 levels: woman, man, balanced within region).\n"
        "One-attribute proof: 48 sets rendered (432 renderings compared); the probes differ only in fields a factor "
        "controls (used by the templates: birth_year, full_name, graduation_year, mailbox).\n");
  auto j = nlohmann::json::parse(s.Run({"--json", "check"}).out);
  CHECK(j["factors"][0]["label"] == "age (years)");
  CHECK(j["factors"][0]["scores"] == nlohmann::json({28.0, 45.0, 58.0}));
  CHECK(j["factors"][0]["level_labels"]["58"] == "aged 58");
  CHECK(j["factors"][0]["signal"] == "the template fields birth_year and graduation_year");
  CHECK(j["factors"][1]["vary"] == "between");
  CHECK(j["factors"][1]["signal"] == "the applicant's name and contact details");
}

TEST_CASE("cli designs: plan shows the carry-over table with its test") {
  AgeStudyFolder s;
  auto r = s.Run({"plan"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  // The balance tables name arms by code; the line above them gives their labels.
  CHECK(r.out.find("\n\nArms by their display labels: age=28,gender=f = aged 28, woman; age=28,gender=m = aged 28, "
                   "man; age=45,gender=f = aged 45, woman; age=45,gender=m = aged 45, man; age=58,gender=f = aged 58, "
                   "woman; age=58,gender=m = aged 58, man.\n\nBalance of the plan") != std::string::npos);
  const auto at = r.out.find("Carry-over (probes per arm by the arm sent just before it in the same set;");
  REQUIRE(at != std::string::npos);
  CHECK(r.out.find("  arm x previous arm: X2 = ", at) != std::string::npos);
  CHECK(r.out.find("    age=28,gender=f  ", at) != std::string::npos);
  auto j = nlohmann::json::parse(s.Run({"--json", "plan"}).out);
  CHECK(j["carry_over"]["pairs"] == 96);
  CHECK(j["carry_over"]["test"]["df"] == 10);
  CHECK(j["carry_over"]["possible"][0][0] == false);
}

TEST_CASE("cli designs: check and freeze refuse looks that monitor could not watch, and write nothing") {
  AgeStudyFolder s;
  testing::WriteFile(s.study + "/study.toml", testing::AgeStudyToml() + "\n[analysis]\nlooks = [150]\n");
  const std::string message =
      "twinprobe: " + s.study + "/study.toml:61:9: [analysis].looks plans interim looks, but monitor can only watch a "
      "paired design (two arms, a set of two probes per vacancy) and this design is 'sets' — remove looks and "
      "analyse once at the end of fieldwork with 'twinprobe analyze'\n";
  for (const char* command : {"check", "freeze"}) {
    auto r = s.Run({command});
    INFO(command);
    CHECK(r.exit_code == 1);
    CHECK(r.err == message);
    CHECK(r.out.empty());
  }
  CHECK_FALSE(std::filesystem::exists(s.study + "/study.db"));
}

TEST_CASE("cli designs: the report describes each factor's signal and labels from the design") {
  AgeStudyFolder s;
  REQUIRE(RunCli({"--study", s.study, "plan"}).exit_code == 0);
  const std::string out = s.study + "/reports/report.html";
  auto r = RunCli({"--study", s.study, "report", "--out", out});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const std::string html = testing::ReadFile(out);
  // Age shows through the template's years, gender through the name pools
  // (the signal the design states), not always "the applicant's name".
  CHECK(html.find("signalled by the template fields birth_year and graduation_year (age); the applicant&#39;s name "
                  "and contact details (gender)") != std::string::npos);
  CHECK(html.find("28 (aged 28), 45 (aged 45), 58 (aged 58)") != std::string::npos);
  CHECK(html.find("age (years) (age)") != std::string::npos);
  CHECK(html.find("gender, between vacancies") != std::string::npos);
}
