// End-to-end tests of `import applications` (cli/import_applications_cmd.cpp,
// collector/import_applications.h) on an invented HR file: 129 applications
// in 14 requisitions at two invented sites, groups "woman" and "man", the
// outcome "invited" (yes/no). Every number is checked against R 4.x; the R
// call is named beside each value (d <- read.csv(FILE); d$pos <-
// factor(d$invited == "yes", levels = c(TRUE, FALSE)); d$g <- factor(d$gender,
// levels = c("woman", "man"))).
#include <catch2/catch.hpp>

#include <filesystem>
#include <regex>

#include <nlohmann/json.hpp>

#include "testing/testing.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;
using testing::RunCli;

namespace {

std::string HrFile() { return testing::SourceDir() + "/tests/cli/data/hr_applications.csv"; }

// The same file under the importer's own column names, outcomes 1/0.
std::string WriteRenamedFile(const testing::TempDir& dir) {
  std::string in = testing::ReadFile(HrFile()), out;
  size_t start = in.find('\n') + 1;
  out = "vacancy,applicant,site,role,arm,years_experience,outcome,furthest_stage\n";
  for (size_t end; (end = in.find('\n', start)) != std::string::npos; start = end + 1) {
    std::string line = in.substr(start, end - start);
    line = std::regex_replace(line, std::regex(",yes,"), ",1,");
    line = std::regex_replace(line, std::regex(",no,"), ",0,");
    out += line + "\n";
  }
  const std::string path = dir / "renamed.csv";
  testing::WriteFile(path, out);
  return path;
}

// The unpaired comparison of "man" with "woman" and the stratified results
// over requisitions, as `analyze --json` gives them; checked against R.
void CheckNumbersAgainstR(const nlohmann::json& j) {
  const auto& c = j["effects"]["comparisons"][0];
  CHECK(c["table"]["a"] == 37);  // table(d$g, d$pos): woman 37 TRUE / 27 FALSE, man 40 / 25
  CHECK(c["table"]["b"] == 27);
  CHECK(c["table"]["c"] == 40);
  CHECK(c["table"]["d"] == 25);
  // fisher.test(table(d$g, d$pos))$p.value
  CHECK_THAT(c["fisher"]["p"].get<double>(), WithinRel(0.72130428820644088, 1e-9));
  // prop.test(40, 65, correct = FALSE)$conf.int and prop.test(37, 64, correct = FALSE)$conf.int (Wilson)
  CHECK_THAT(c["other_rate_wilson"][0].get<double>(), WithinRel(0.49384202806013094, 1e-9));
  CHECK_THAT(c["other_rate_wilson"][1].get<double>(), WithinRel(0.7240499262499791, 1e-9));
  CHECK_THAT(c["reference_rate_wilson"][0].get<double>(), WithinRel(0.45610031540082902, 1e-9));
  CHECK_THAT(c["reference_rate_wilson"][1].get<double>(), WithinRel(0.69130217525654514, 1e-9));
  CHECK_THAT(c["impact_ratio"]["estimate"].get<double>(), WithinRel((40.0 / 65) / (37.0 / 64), 1e-12));
  CHECK_THAT(c["rate_difference"]["estimate"].get<double>(), WithinRel(40.0 / 65 - 37.0 / 64, 1e-12));
  nlohmann::json by_vacancy;
  for (const auto& a : j["effects"]["across_strata"])
    if (a["column"] == "vacancy") by_vacancy = a;
  REQUIRE(by_vacancy.is_object());
  CHECK(by_vacancy["values"] == 14);
  CHECK(by_vacancy["sparse"] == true);
  // s <- table(d$g, d$pos, d$req_id); m <- mantelhaen.test(s): estimate, conf.int, statistic, p.value
  CHECK_THAT(by_vacancy["mantel_haenszel"]["estimate"].get<double>(), WithinRel(0.60411155970114616, 1e-9));
  CHECK_THAT(by_vacancy["mantel_haenszel"]["conf_int"][0].get<double>(), WithinRel(0.27016908731374756, 1e-9));
  CHECK_THAT(by_vacancy["mantel_haenszel"]["conf_int"][1].get<double>(), WithinRel(1.3508235904899579, 1e-9));
  CHECK_THAT(by_vacancy["cmh"]["statistic_corrected"].get<double>(), WithinRel(1.0075913427358427, 1e-9));
  CHECK_THAT(by_vacancy["cmh"]["p_corrected"].get<double>(), WithinRel(0.31548057101653221, 1e-9));
  // mantelhaen.test(s, correct = FALSE): statistic, p.value
  CHECK_THAT(by_vacancy["cmh"]["statistic"].get<double>(), WithinRel(1.4364147134277288, 1e-9));
  CHECK_THAT(by_vacancy["cmh"]["p"].get<double>(), WithinRel(0.23072040000405786, 1e-9));
  // mantelhaen.test(s, exact = TRUE): statistic S = 37, p.value; the
  // estimate is R's uniroot solution (about four digits, stats/exact_stratified.h).
  CHECK(by_vacancy["exact_conditional"]["statistic"] == 37);
  CHECK_THAT(by_vacancy["exact_conditional"]["p"].get<double>(), WithinRel(0.247353630960985, 1e-9));
  CHECK_THAT(by_vacancy["exact_conditional"]["conditional_mle_odds_ratio"].get<double>(),
             WithinRel(0.62280448109745823, 1e-4));
}

}  // namespace

TEST_CASE("import applications: an HR file with its own column names lands in an empty folder") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  auto r = RunCli({"--study", study, "import", "applications", HrFile(), "--kind", "unpaired", "--columns",
                   "arm=gender,outcome=invited,vacancy=req_id", "--reference", "woman", "--factor", "gender",
                   "--positive", "yes", "--strata", "site"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Created an unpaired study of applications from " + HrFile() +
                     ": 129 applications in 14 vacancies; gender woman (reference) compared with man; a positive "
                     "outcome is yes; strata site and vacancy.\nNext: twinprobe --study " + study + " analyze\n" +
                     testing::HeadLine(study));
  CHECK(r.err == "twinprobe: warning: the columns 'applicant', 'role', 'years_experience' and 'furthest_stage' are "
                 "not used; name stratum columns with --strata and the file's own names for the roles with --columns\n");
  auto a = RunCli({"--study", study, "--json", "analyze"});
  REQUIRE(a.exit_code == 0);
  CheckNumbersAgainstR(nlohmann::json::parse(a.out));
}

TEST_CASE("import applications: the same file under the importer's own names needs no mapping") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  auto r = RunCli({"--study", study, "import", "applications", WriteRenamedFile(dir), "--kind", "unpaired",
                   "--reference", "woman", "--factor", "gender"});
  CHECK(r.exit_code == 0);
  CHECK(r.out.rfind("Created an unpaired study of applications from " + (dir / "renamed.csv") +
                        ": 129 applications in 14 vacancies; gender woman (reference) compared with man; a positive "
                        "outcome is info_request, invitation, offer and 1; strata vacancy.\n",
                    0) == 0);
  auto a = RunCli({"--study", study, "--json", "analyze"});
  REQUIRE(a.exit_code == 0);
  CheckNumbersAgainstR(nlohmann::json::parse(a.out));
}

TEST_CASE("import applications: without a vacancy column every application stands alone") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  auto r = RunCli({"--study", study, "import", "applications", HrFile(), "--kind", "unpaired", "--columns",
                   "arm=gender,outcome=invited,probe=applicant", "--reference", "woman", "--positive", "yes"});
  CHECK(r.exit_code == 0);
  CHECK(r.out.rfind("Created an unpaired study of applications from " + HrFile() +
                        ": 129 applications; group woman (reference) compared with man; a positive "
                        "outcome is yes; strata none.\n",
                    0) == 0);
  auto j = nlohmann::json::parse(RunCli({"--study", study, "--json", "analyze"}).out);
  CHECK(j["effects"]["across_strata"].empty());
  // fisher.test(table(d$g, d$pos))$p.value: the pooled table does not need the requisitions.
  CHECK_THAT(j["effects"]["comparisons"][0]["fisher"]["p"].get<double>(), WithinRel(0.72130428820644088, 1e-9));
}

TEST_CASE("issue 19: a study of records is worded as records, never as a correspondence test") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  REQUIRE(RunCli({"--study", study, "import", "applications", HrFile(), "--kind", "unpaired", "--columns",
                  "arm=gender,outcome=invited,vacancy=req_id", "--reference", "woman", "--factor", "gender",
                  "--positive", "yes"})
              .exit_code == 0);
  auto a = RunCli({"--study", study, "analyze"});
  REQUIRE(a.exit_code == 0);
  for (const char* word : {"ictitious", "orrespondence test", " sent", "send order", "observation window"}) {
    INFO(word);
    CHECK(a.out.find(word) == std::string::npos);
  }
  CHECK(a.out.find("What was tested.\n  This study asked whether the outcome of job applications differs by the\n"
                   "  applicant's gender (woman or man). The data are the records of 129\n"
                   "  applications in 14 vacancies, each with its recorded outcome. The applicants\n"
                   "  were real and were not matched: they may differ in qualifications,\n"
                   "  experience and other respects that the data do not hold.\n") != std::string::npos);
  CHECK(a.out.find("  A positive outcome is yes. The outcome was positive for 37 of 64\n"
                   "  applications from woman applicants (57.8%) and 40 of 65 applications from\n"
                   "  man applicants (61.5%). The selection rate of woman applicants was 0.94\n"
                   "  times the highest group's, not below four-fifths.\n") != std::string::npos);
  CHECK(a.out.find("  Fisher's exact test, two-sided, does not reject equal selection rates of\n"
                   "  woman and man applicants at the study's threshold of 0.05 (p = 0.721).") != std::string::npos);
  CHECK(a.out.find("  These are records, not an experiment: a difference in outcome between groups\n"
                   "  may reflect unequal treatment, or job-relevant differences between the\n"
                   "  applicants that the data do not hold, or both. The comparison within\n"
                   "  vacancies removes differences between vacancies (where and for what people\n"
                   "  applied), not differences between the applicants of one vacancy.") != std::string::npos);
  CHECK(a.out.find("  Some tables are sparse (an expected count below 5, the rule of Cochran 1954, Biometrics "
                   "10:417-451), so\n  the Breslow-Day test and the CMH X^2 are unreliable here;") != std::string::npos);
  CHECK(a.out.find("  The table of each vacancy is in the JSON output (analyze --json).\n") != std::string::npos);
  CHECK(a.out.find("By stratum") == std::string::npos);  // no 14 one-line Fisher tests
  auto html = RunCli({"--study", study, "report", "--out", dir / "r.html"});
  REQUIRE(html.exit_code == 0);
  const std::string page = testing::ReadFile(dir / "r.html");
  CHECK(page.find("report on application records</title>") != std::string::npos);
  CHECK(page.find("deceives employers") == std::string::npos);
  CHECK(page.find("29 CFR 1607.4(D)") != std::string::npos);
}

TEST_CASE("import applications: bad options and columns say what is wrong and leave no store") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  auto run = [&](std::vector<std::string> extra) {
    std::vector<std::string> args = {"--study", study, "import", "applications", HrFile()};
    args.insert(args.end(), extra.begin(), extra.end());
    return RunCli(args);
  };
  auto missing = run({"--kind", "unpaired", "--columns", "arm=gendr,outcome=invited", "--reference", "woman"});
  CHECK(missing.exit_code == 1);
  CHECK(missing.err == "twinprobe: " + HrFile() +
                           ":1: the column 'gendr' named by --columns arm=gendr is missing (did you mean 'gender'?) "
                           "\u2014 name one of the file's columns: 'req_id', 'applicant', 'site', 'role', 'gender', "
                           "'years_experience', 'invited', 'furthest_stage'\n");
  auto positive = run({"--kind", "unpaired", "--columns", "arm=gender,outcome=invited", "--reference", "woman",
                       "--positive", "yess"});
  CHECK(positive.exit_code == 1);
  CHECK(positive.err == "twinprobe: --positive 'yess' is not a value of the outcome column (did you mean 'yes'?) "
                        "\u2014 the outcome column of " + HrFile() + " holds 'no', 'yes'\n");
  auto paired = run({"--kind", "paired", "--columns", "arm=role,outcome=invited,vacancy=applicant", "--reference",
                     "clerk", "--positive", "yes"});
  CHECK(paired.exit_code == 1);
  CHECK(paired.err == "twinprobe: --kind paired compares two groups, but the arm column holds 3: 'clerk', 'analyst', "
                      "'technician' \u2014 use --kind sets (one application of each group per vacancy) or --kind "
                      "unpaired\n");
  auto twice = run({"--kind", "paired", "--columns", "arm=site,outcome=invited,vacancy=req_id", "--reference",
                    "Millbrook", "--positive", "yes"});
  CHECK(twice.exit_code == 1);
  CHECK(twice.err == "twinprobe: " + HrFile() +
                         ":3: vacancy 'REQ-001' has a second row for arm 'Millbrook' (the first is on line 2) \u2014 "
                         "keep one row per vacancy and arm\n");
  auto kind = run({"--kind", "twins"});
  CHECK(kind.exit_code == 1);
  CHECK(kind.err == "twinprobe: --kind: 'twins' is not a kind of study \u2014 use paired (two groups, one application "
                    "of each per vacancy), sets (one of each group per vacancy) or unpaired (any applications, "
                    "vacancies optional)\n");
  auto role = run({"--kind", "unpaired", "--columns", "arm=gender,result=invited"});
  CHECK(role.exit_code == 1);
  CHECK(role.err == "twinprobe: --columns: 'result' is not a column role \u2014 map the file's columns to vacancy, "
                    "arm, outcome, sent_at, responded_at, probe or employer\n");
  CHECK_FALSE(std::filesystem::exists(study + "/study.db"));
}

TEST_CASE("import applications: five hiring stages give per-stage rates and Fisher tests as R") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  auto r = RunCli({"--study", study, "import", "applications", HrFile(), "--kind", "unpaired", "--columns",
                   "arm=gender,outcome=furthest_stage,vacancy=req_id", "--reference", "woman", "--factor", "gender",
                   "--stages", "applied,screened,interview,offer,hire"});
  CHECK(r.exit_code == 0);
  CHECK(r.out.rfind("Created an unpaired study of applications from " + HrFile() +
                        ": 129 applications in 14 vacancies; gender woman (reference) compared with man; a positive "
                        "outcome is screened, interview, offer and hire; strata vacancy.\n",
                    0) == 0);
  auto j = nlohmann::json::parse(RunCli({"--study", study, "--json", "analyze"}).out);
  const auto& stages = j["stages"]["stages"];
  REQUIRE(stages.size() == 5);
  CHECK(j["stages"]["correction"] == "holm");
  // d$k <- match(d$furthest_stage, st); for stage k: reached = sum(d$k >= k) by gender,
  // fisher.test(matrix(c(rw, rm, nw - rw, nm - rm), 2))$p.value (among all) and
  // fisher.test(matrix(c(rw, rm, pw - rw, pm - rm), 2))$p.value (among the previous stage);
  // adjusted: p.adjust(c(...), "holm") over the four stages after "applied".
  struct Expected {
    int64_t woman_reached, woman_previous, man_reached, man_previous;
    double p_all, p_previous, p_all_holm, p_previous_holm;
  };
  const Expected expected[] = {
      {37, 64, 40, 65, 0.72130428820644088, 0.72130428820644088, 0.72130428820644088, 0.77192982456140347},
      {15, 37, 26, 40, 0.058418982200258818, 0.040839386022070566, 0.11683796440051764, 0.16335754408828226},
      {4, 15, 15, 26, 0.011469374612289727, 0.10281593552639973, 0.034408123836869184, 0.30844780657919918},
      {3, 4, 14, 15, 0.0077055011237762419, 0.38596491228070173, 0.030822004495104968, 0.77192982456140347},
  };
  CHECK(stages[0]["groups"][0]["reached"] == 64);
  CHECK(stages[0]["groups"][1]["reached"] == 65);
  for (size_t k = 1; k < 5; ++k) {
    INFO(stages[k]["stage"]);
    const Expected& e = expected[k - 1];
    CHECK(stages[k]["groups"][0]["reached"] == e.woman_reached);
    CHECK(stages[k]["groups"][0]["at_previous_stage"] == e.woman_previous);
    CHECK(stages[k]["groups"][1]["reached"] == e.man_reached);
    CHECK(stages[k]["groups"][1]["at_previous_stage"] == e.man_previous);
    const auto& t = stages[k]["tests"][0];
    CHECK_THAT(t["p_among_all"].get<double>(), WithinRel(e.p_all, 1e-9));
    CHECK_THAT(t["p_among_previous"].get<double>(), WithinRel(e.p_previous, 1e-9));
    CHECK_THAT(t["p_among_all_adjusted"].get<double>(), WithinRel(e.p_all_holm, 1e-9));
    CHECK_THAT(t["p_among_previous_adjusted"].get<double>(), WithinRel(e.p_previous_holm, 1e-9));
  }
  auto text = RunCli({"--study", study, "analyze"}).out;
  CHECK(text.find("  interview: woman 15/64 (23.4%), of previous 15/37 (40.5%); man 26/65 (40.0%), of previous 26/40 "
                  "(65.0%);\n    man: among all p = 0.0584 (adjusted 0.117); among the previous stage p = 0.0408 "
                  "(adjusted 0.163)\n") != std::string::npos);
  REQUIRE(RunCli({"--study", study, "report", "--out", dir / "r.html"}).exit_code == 0);
  const std::string page = testing::ReadFile(dir / "r.html");
  CHECK(page.find("id=\"fig-stages\"") != std::string::npos);
  CHECK(page.find("Hiring funnel by group.") != std::string::npos);
}

TEST_CASE("import applications: an outcome that is no stage names the stages") {
  testing::TempDir dir;
  auto r = RunCli({"--study", dir / "hr", "import", "applications", HrFile(), "--kind", "unpaired", "--columns",
                   "arm=gender,outcome=furthest_stage", "--reference", "woman", "--stages",
                   "applied,screened,interviewed,offer,hire"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + HrFile() +
                     ":5: outcome 'interview' is not one of the stages (did you mean 'interviewed'?) \u2014 write the "
                     "furthest stage each application reached: applied, screened, interviewed, offer, hire\n");
  CHECK_FALSE(std::filesystem::exists(dir / "hr/study.db"));
}
