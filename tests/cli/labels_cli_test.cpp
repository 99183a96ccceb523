// Display labels in every output of an analysed study: the 3-level ordered
// age study (tests/planner/age_study.h, labels "aged 28" … and "woman",
// "man") with every probe sent and answered by a fixed rule, then
// `analyze` (text and JSON) and `report` (HTML). Codes stay as they are
// beside the labels.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>
#include <sstream>

#include "planner/age_study.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// After the observation windows of the sendings below.
const std::vector<std::string> kLater = {"TWINPROBE_NOW=2027-09-01T12:00:00Z"};

// Plans the age study, sends every probe on 2027-05-05 and records an
// invitation by a fixed rule of the vacancy number: aged 28 at every second
// vacancy, aged 45 at every third, aged 58 at every fifth, and men also at
// every seventh.
struct AnsweredAgeStudy {
  testing::TempDir dir;
  std::string study = dir / "age";
  AnsweredAgeStudy() {
    testing::WriteAgeStudy(study);
    REQUIRE(RunCli({"--study", study, "plan"}, kLater).exit_code == 0);
    REQUIRE(RunCli({"--study", study, "export"}, kLater).exit_code == 0);
    std::istringstream probes(testing::ReadFile(study + "/export/probes.csv"));
    std::string line, sendings = "probe,sent_at\n", outcomes = "probe,code,received_at\n";
    std::getline(probes, line);  // header
    while (std::getline(probes, line)) {
      // P00001,A001,"age=58,gender=f",...
      const std::string probe = line.substr(0, line.find(','));
      const int vacancy = std::stoi(line.substr(line.find(",A") + 2, 3));
      const size_t quote = line.find('"');
      const std::string arm = line.substr(quote + 1, line.find('"', quote + 1) - quote - 1);
      const int every = arm.find("age=28") != std::string::npos ? 2 : arm.find("age=45") != std::string::npos ? 3 : 5;
      const bool positive = vacancy % every == 0 || (arm.find("gender=m") != std::string::npos && vacancy % 7 == 0);
      sendings += probe + ",2027-05-05T09:00:00Z\n";
      outcomes += probe + (positive ? ",invitation,2027-05-10T09:00:00Z\n" : ",none,\n");
    }
    testing::WriteFile(dir / "sendings.csv", sendings);
    testing::WriteFile(dir / "outcomes.csv", outcomes);
    REQUIRE(RunCli({"--study", study, "import", "sendings", dir / "sendings.csv"}, kLater).exit_code == 0);
    REQUIRE(RunCli({"--study", study, "import", "outcomes", dir / "outcomes.csv"}, kLater).exit_code == 0);
  }
};

}  // namespace

TEST_CASE("cli labels: analyze shows the display labels of factors and levels beside their codes") {
  AnsweredAgeStudy s;
  auto r = RunCli({"--study", s.study, "analyze"}, kLater);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  // The plain summary speaks in labels.
  CHECK(r.out.find("depending on the applicant's age (years) and gender.") != std::string::npos);
  CHECK(r.out.find("(aged 28, woman, aged 28, man, aged 45, woman, aged 45, man, aged 58, woman\n  and aged 58, man)") !=
        std::string::npos);
  // The level table keeps the code beside the label; pairs and the model use
  // labels. Counts by the rule (python over the exported probes, by hand):
  // aged 28 25 of 48, aged 45 18, aged 58 12; 28 vs 45 a 10, b 15, c 8, d 15.
  CHECK(r.out.find("Factor age (years) (varied within sets), positive callback by level:\n"
                   "  aged 28 (28)             25 / 48       52.1%\n"
                   "  aged 45 (45)             18 / 48       37.5%\n"
                   "  aged 58 (58)             12 / 48       25.0%\n") != std::string::npos);
  CHECK(r.out.find("  age (years) aged 28 vs aged 45: 52.1% vs 37.5% in 48 sets (a 10, only aged 28 15, only aged 45 8, d 15);") !=
        std::string::npos);
  CHECK(r.out.find("  woman (f)  ") != std::string::npos);
  // Gender varies between vacancies: the arms are compared with the reference
  // only within its gender, and the template/position model says why its arm
  // terms cannot be estimated (the design, not the data).
  CHECK(r.out.find("  Not compared with the reference, whose sets they never share") != std::string::npos);
  CHECK(r.out.find("  p-values adjusted across the 2 comparisons (holm):") != std::string::npos);
  CHECK(r.out.find("its arm terms cannot be estimated in this design: a factor varied between vacancies") !=
        std::string::npos);
  CHECK(r.out.find("  odds ratio aged 45 x man = ") != std::string::npos);
  CHECK(r.out.find("age (years) x gender: the likelihood-ratio test") != std::string::npos);
  // Technical lines name the arm's code first, then its labels.
  CHECK(r.out.find("Comparisons with the reference arm (age=28,gender=f (aged 28, woman))") != std::string::npos);
  CHECK(r.out.find("Design: factor age = age (years) (28 = aged 28, 45 = aged 45, 58 = aged 58; reference 28); factor "
                   "gender (f = woman, m = man; reference f);") != std::string::npos);
}

TEST_CASE("cli labels: the JSON carries a label beside every code, codes unchanged") {
  AnsweredAgeStudy s;
  auto r = RunCli({"--study", s.study, "--json", "analyze"}, kLater);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const auto j = nlohmann::json::parse(r.out);
  const auto& age = j["k_levels"]["factors"][0];
  CHECK(age["name"] == "age");
  CHECK(age["label"] == "age (years)");
  CHECK(age["levels"][1]["level"] == "45");
  CHECK(age["levels"][1]["label"] == "aged 45");
  CHECK(age["pairwise"][2]["first"] == "45");
  CHECK(age["pairwise"][2]["first_label"] == "aged 45");
  CHECK(age["pairwise"][2]["second_label"] == "aged 58");
  const auto& model = j["k_levels"]["two_factor_model"];
  CHECK(model["tests"][2]["effect"] == "age x gender");
  CHECK(model["tests"][2]["label"] == "age (years) x gender");
  CHECK(model["terms"][0]["term"] == "age=45");
  CHECK(model["terms"][0]["label"] == "aged 45");
  CHECK(j["arms"][1]["label"] == "age=28,gender=m");
  CHECK(j["arms"][1]["display_label"] == "aged 28, man");
  CHECK(j["design"]["factors"][1]["label"] == "gender");
  CHECK(j["design"]["factors"][1]["level_labels"]["m"] == "man");
  CHECK(j["design"]["arms"][0]["display_label"] == "aged 28, woman");
  // Men's arms never share a set with the reference (gender varies between
  // vacancies): no comparison with it, named instead.
  CHECK(j["effects"]["comparisons"][0]["other_arm"] == "age=45,gender=f");
  CHECK(j["effects"]["comparisons"][0]["other_arm_label"] == "aged 45, woman");
  CHECK(j["effects"]["comparisons"].size() == 2);
  CHECK(j["effects"]["not_with_reference"] ==
        nlohmann::json::array({"age=28,gender=m", "age=45,gender=m", "age=58,gender=m"}));
}

TEST_CASE("cli labels: the HTML report's results, level and pair tables show the labels") {
  AnsweredAgeStudy s;
  const std::string out = s.dir / "report.html";
  auto r = RunCli({"--study", s.study, "report", "--out", out}, kLater);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const std::string html = testing::ReadFile(out);
  CHECK(html.find("Positive callbacks by level of age (years) (varied within sets)") != std::string::npos);
  CHECK(html.find(">aged 45 (45)<") != std::string::npos);
  CHECK(html.find(">aged 28 vs aged 58<") != std::string::npos);
  CHECK(html.find(">aged 58 x man<") != std::string::npos);
  CHECK(html.find("positive answers to <bdi>aged 28, woman</bdi> applicants") != std::string::npos);
  CHECK(html.find("Every pair of gender levels") != std::string::npos);
  CHECK(html.find(">woman vs man<") != std::string::npos);
}
