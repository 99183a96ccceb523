// `import applications` as an HR department would use it: its own column
// names, five hiring stages as yes/no columns, two covariates kept with each
// application, then `analyze`: every number of the adjusted model and of the
// stages checked against R run live on the same applications.
#include <catch2/catch.hpp>

#include <cmath>
#include <filesystem>
#include <sstream>

#include <nlohmann/json.hpp>

#include "stats/r_eval.h"
#include "stats/r_run.h"
#include "stats/random.h"
#include "testing/testing.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;
using testing::RunCli;

namespace {

const char* const kStages[] = {"Applied", "Screened", "Interviewed", "Offered", "Hired"};

struct HrFile {
  std::string csv;  // as the HR system exports it
  std::string tsv;  // for R: group, y (reached beyond Applied), the covariates; then the furthest stage
};

// 2,000 applications in 120 requisitions, three groups, years of experience
// and a degree, each stage passed with a probability from a logistic model.
// Yes and no are spelled as exports do (yes, Yes, 1 / no, No, 0).
HrFile DrawHrFile(uint64_t seed) {
  stats::Rng rng(seed);
  const char* const groups[] = {"Group A", "Group B", "Group C"};
  const double group_effect[] = {0, -0.4, -0.2};
  const char* const degrees[] = {"none", "vocational", "bachelor", "master"};
  const double degree_effect[] = {0, 0.2, 0.5, 0.6};
  const double stage_shift[] = {0, -1.0, -1.5, 0.5};
  const char* const yes[] = {"yes", "Yes", "1"};
  const char* const no[] = {"no", "No", "0"};
  std::ostringstream csv, tsv;
  csv << "Requisition,Candidate group,Years experience,Highest degree,Applied,Screened,Interviewed,Offered,Hired\n";
  tsv << "group\ty\tYears experience\tHighest degree\tstage\n";
  for (int i = 0; i < 2000; ++i) {
    const int64_t req = rng.Between(1, 120);
    const size_t g = static_cast<size_t>(rng.Between(0, 2));
    const int64_t years = rng.Between(0, 25);
    const size_t k = static_cast<size_t>(rng.Between(0, 3));
    const double base = -0.3 + 0.05 * static_cast<double>(years) + degree_effect[k] + group_effect[g];
    int reached = 0;  // index of the furthest stage
    while (reached < 4 && rng.Uniform() < 1 / (1 + std::exp(-(base + stage_shift[reached])))) ++reached;
    char ref[16];
    std::snprintf(ref, sizeof ref, "REQ-%04lld", static_cast<long long>(req));
    csv << ref << "," << groups[g] << "," << years << "," << degrees[k];
    for (int s = 0; s < 5; ++s) csv << "," << (s <= reached ? yes[rng.Between(0, 2)] : no[rng.Between(0, 2)]);
    csv << "\n";
    tsv << groups[g] << "\t" << (reached > 0 ? 1 : 0) << "\t" << years << "\t" << degrees[k] << "\t" << reached + 1
        << "\n";
  }
  return {csv.str(), tsv.str()};
}

std::vector<std::string> ImportArgs(const std::string& study, const std::string& file) {
  return {"--study", study, "import", "applications", file, "--kind", "unpaired",
          "--columns", "vacancy=Requisition,arm=Candidate group", "--reference", "Group A",
          "--stages", "Applied,Screened,Interviewed,Offered,Hired",
          "--covariates", "Years experience,Highest degree"};
}

void Near(double ours, double theirs, double rel) { CHECK_THAT(ours, WithinRel(theirs, rel) || WithinAbs(theirs, 1e-10)); }

}  // namespace

TEST_CASE("import applications: an HR file of 2000 applications with stage columns and covariates agrees with R") {
  testing::TempDir dir;
  const HrFile hr = DrawHrFile(20261202);
  const std::string file = dir / "hr_export.csv";
  testing::WriteFile(file, hr.csv);
  const std::string study = dir / "hr";
  auto r = RunCli(ImportArgs(study, file));
  REQUIRE(r.exit_code == 0);
  CHECK(r.err.empty());
  CHECK(r.out == "Created an unpaired study of applications from " + file +
                     ": 2000 applications in 120 vacancies; group Group A (reference) compared with Group B and Group "
                     "C; a positive outcome is Screened, Interviewed, Offered and Hired; strata vacancy; covariates "
                     "Years experience (numeric) and Highest degree (categorical, 4 categories).\nNext: twinprobe "
                     "--study " + study + " analyze\n" + testing::HeadLine(study));
  auto a = RunCli({"--study", study, "--json", "analyze"});
  REQUIRE(a.exit_code == 0);
  const nlohmann::json j = nlohmann::json::parse(a.out);

  // The adjusted model against glm(y ~ group + Years.experience +
  // Highest.degree, family = binomial) on the same applications.
  const auto& m = j["covariate_model"];
  CHECK(m["applications"] == 2000);
  CHECK(m["covariates"][1]["baseline"] == "bachelor");
  auto ref = testing::RunRScript("covariate_glm.R", hr.tsv.substr(0, 0) + [&] {
    // covariate_glm.R reads group, y and the covariates only.
    std::istringstream in(hr.tsv);
    std::ostringstream out;
    for (std::string line; std::getline(in, line);) out << line.substr(0, line.rfind('\t')) << "\n";
    return out.str();
  }(), "0.95 'Group A'");
  const auto& terms = m["terms"];
  REQUIRE(terms.size() == ref["coef"].size());
  Near(m["deviance"].get<double>(), ref["deviance"][0], 1e-10);            // deviance(glm(...))
  Near(m["null_deviance"].get<double>(), ref["null_deviance"][0], 1e-10);  // glm(...)$null.deviance
  CHECK(m["df_residual"] == ref["df"][0]);                                 // glm(...)$df.residual
  for (size_t t = 0; t < terms.size(); ++t) {
    INFO("term " << terms[t]["term"]);
    Near(terms[t]["coefficient"].get<double>(), ref["coef"][t], 1e-8);     // coef(glm(...))
    Near(terms[t]["standard_error"].get<double>(), ref["se"][t], 1e-8);    // summary(glm(...))$coefficients[, 2]
    Near(terms[t]["p_wald"].get<double>(), ref["p"][t], 1e-8);             // ... [, 4]
    Near(terms[t]["wald_conf_int"][0].get<double>(), std::exp(ref["wald_low"][t]), 1e-8);  // exp(confint.default(glm(...)))
    Near(terms[t]["wald_conf_int"][1].get<double>(), std::exp(ref["wald_high"][t]), 1e-8);
  }
  CHECK(terms[1]["term"] == "group: Group B");  // the importer's order: the reference, then as they first appear
  for (size_t g = 0; g < 2; ++g) {
    const auto& t = terms[1 + g];
    // uniroot(tol = 1e-12) on glm's profile deviance
    Near(t["profile_conf_int"][0].get<double>(), std::exp(ref["profile_low"][g]), 1e-8);
    Near(t["profile_conf_int"][1].get<double>(), std::exp(ref["profile_high"][g]), 1e-8);
  }
  // anova(glm(y ~ Years.experience + Highest.degree), glm(y ~ group + ...), test = "LRT")
  Near(m["group_test"]["lr_statistic"].get<double>(), ref["lr"][0], 1e-8);
  CHECK(m["group_test"]["df"] == 2);
  Near(m["group_test"]["p"].get<double>(), ref["lr"][2], 1e-8);

  // The HTML section says what the adjustment removes and what it does not,
  // in the words of records.
  REQUIRE(RunCli({"--study", study, "report", "--out", dir / "r.html"}).exit_code == 0);
  const std::string html = testing::ReadFile(dir / "r.html");
  const size_t at = html.find("<section id=\"covariates\">");
  REQUIRE(at != std::string::npos);
  const std::string section = html.substr(at, html.find("</section>", at) - at);
  CHECK(section.find("<p>The adjustment removes the part of the groups&#39; difference that Years experience and "
                     "Highest degree explain, as the model states it: each covariate shifts the log-odds of a positive "
                     "outcome by the same amount in every group (additive on the log-odds scale, no interactions).</p>") !=
        std::string::npos);
  CHECK(section.find("A covariate that is itself an outcome of the selection (a score given by the screener, a rating "
                     "after an interview) can hide discrimination rather than explain it") != std::string::npos);
  for (const char* word : {"ictitious", " sent", "orrespondence"}) {
    INFO(word);
    CHECK(section.find(word) == std::string::npos);
  }

  // The stages, derived from the yes/no columns, against fisher.test on the
  // furthest stage each application reached.
  const std::string tsv_path = dir / "hr.tsv";
  testing::WriteFile(tsv_path, hr.tsv);
  auto fisher = testing::RunR(
      "d <- read.delim('" + tsv_path + "', check.names = FALSE)\n"
      "out <- c()\n"
      "for (k in 2:5) for (g in setdiff(unique(d$group), 'Group A')) {\n"
      "  a <- d[d$group == 'Group A', ]; o <- d[d$group == g, ]\n"
      "  ra <- sum(a$stage >= k); ro <- sum(o$stage >= k); pa <- sum(a$stage >= k - 1); po <- sum(o$stage >= k - 1)\n"
      "  all <- fisher.test(matrix(c(ro, ra, nrow(o) - ro, nrow(a) - ra), 2))$p.value\n"
      "  prev <- fisher.test(matrix(c(ro, ra, po - ro, pa - ra), 2))$p.value\n"
      "  out <- c(out, ra, ro, pa, po, all, prev)\n"
      "}\n"
      "cat(format(out, digits = 17), sep = '\\n')\n");
  REQUIRE(fisher.ok);
  REQUIRE(fisher.values.size() == 48);
  const auto& stages = j["stages"]["stages"];
  REQUIRE(stages.size() == 5);
  for (size_t k = 1; k < 5; ++k) {
    INFO("stage " << stages[k]["stage"]);
    CHECK(stages[k]["stage"] == kStages[k]);
    for (size_t g = 0; g < 2; ++g) {
      const double* e = &fisher.values[((k - 1) * 2 + g) * 6];
      CHECK(stages[k]["groups"][0]["reached"] == e[0]);            // sum(a$stage >= k)
      CHECK(stages[k]["groups"][1 + g]["reached"] == e[1]);        // sum(o$stage >= k)
      CHECK(stages[k]["groups"][0]["at_previous_stage"] == e[2]);  // sum(a$stage >= k - 1)
      CHECK(stages[k]["groups"][1 + g]["at_previous_stage"] == e[3]);
      CHECK_THAT(stages[k]["tests"][g]["p_among_all"].get<double>(), WithinRel(e[4], 1e-9));       // fisher.test(...)$p.value
      CHECK_THAT(stages[k]["tests"][g]["p_among_previous"].get<double>(), WithinRel(e[5], 1e-9));  // fisher.test(...)$p.value
    }
  }
}

TEST_CASE("import applications: bad covariate and stage cells name FILE:LINE:COL and leave no store") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  auto run = [&](const std::string& body) {
    const std::string file = dir / "bad.csv";
    testing::WriteFile(file, "Requisition,Candidate group,Years experience,Highest degree,Applied,Screened,Interviewed,"
                             "Offered,Hired\nREQ-1,Group A,4,master,yes,yes,no,no,no\nREQ-1,Group B,7,none,yes,no,no,no,no\n" +
                                 body);
    auto r = RunCli(ImportArgs(study, file));
    CHECK(r.exit_code == 1);
    CHECK(r.out.empty());
    CHECK_FALSE(std::filesystem::exists(dir / "hr/study.db"));
    return r.err.substr(0, r.err.find(file)) + "FILE" + r.err.substr(r.err.find(file) + file.size());
  };
  CHECK(run("REQ-2,Group A,,bachelor,yes,no,no,no,no\n") ==
        "twinprobe: FILE:4:3: the covariate 'Years experience' is empty \u2014 fill it in; for a category not known write "
        "a category of its own such as 'unknown', or leave the row out\n");
  CHECK(run("REQ-2,Group A,3,bachelor,yes,no,yes,no,no\n") ==
        "twinprobe: FILE:4:6: the application reached 'Interviewed' but not 'Screened' before it \u2014 a stage is "
        "reached through every stage before it: correct the 'Screened' cell or the 'Interviewed' cell\n");
  CHECK(run("REQ-2,Group A,3,bachelor,yes,maybe,no,no,no\n") ==
        "twinprobe: FILE:4:6: the stage 'Screened' holds 'maybe', not yes or no \u2014 write 1, yes, y or true when the "
        "application reached the stage, and 0, no, n or false when not\n");
  CHECK(run("REQ-2,Group A,3,bachelor,no,no,no,no,no\n") ==
        "twinprobe: FILE:4:5: the application reached no stage, not even 'Applied' \u2014 every application reached the "
        "first stage; write yes there, or leave the row out\n");
}

TEST_CASE("import applications: a covariate column that is not in the file is named with the fix") {
  testing::TempDir dir;
  const std::string file = dir / "a.csv";
  testing::WriteFile(file, "vacancy,arm,outcome,years\nV1,a,1,3\nV1,b,0,4\n");
  auto r = RunCli({"--study", dir / "s", "import", "applications", file, "--kind", "unpaired", "--reference", "a",
                   "--covariates", "yeras"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + file + ":1: the covariate column 'yeras' named by --covariates is missing (did you "
                 "mean 'years'?) \u2014 name one of the file's columns: 'vacancy', 'arm', 'outcome', 'years'\n");
}

TEST_CASE("import applications: the worked example's adjusted odds ratio is R's glm on the HR file") {
  testing::TempDir dir;
  const std::string study = dir / "adj";
  REQUIRE(RunCli({"--study", study, "import", "applications", testing::SourceDir() + "/tests/cli/data/hr_applications.csv",
                  "--kind", "unpaired", "--columns", "arm=gender,outcome=invited,vacancy=req_id", "--reference", "woman",
                  "--factor", "gender", "--positive", "yes", "--covariates", "years_experience,role"})
              .exit_code == 0);
  const auto j = nlohmann::json::parse(RunCli({"--study", study, "--json", "analyze"}).out)["covariate_model"];
  const auto& man = j["terms"][1];
  CHECK(man["term"] == "group: man");
  // f <- glm(invited == "yes" ~ gender + years_experience + role, family = binomial,
  //          control = glm.control(epsilon = 1e-30, maxit = 100)); coef(summary(f))["genderman", ]
  CHECK_THAT(man["coefficient"].get<double>(), WithinRel(0.4711377769, 1e-9));
  CHECK_THAT(man["standard_error"].get<double>(), WithinRel(0.39786468992, 1e-9));
  CHECK_THAT(man["p_wald"].get<double>(), WithinRel(0.236347419331, 1e-9));
  // exp(confint.default(f)["genderman", ])
  CHECK_THAT(man["wald_conf_int"][0].get<double>(), WithinRel(0.7344284612, 1e-9));
  CHECK_THAT(man["wald_conf_int"][1].get<double>(), WithinRel(3.4936192731, 1e-9));
  // exp(confint(f)["genderman", ]) (MASS's spline through the profile: 1e-4)
  CHECK_THAT(man["profile_conf_int"][0].get<double>(), WithinRel(0.7412774175, 1e-4));
  CHECK_THAT(man["profile_conf_int"][1].get<double>(), WithinRel(3.5520739437, 1e-4));
  // anova(update(f, . ~ . - gender), f, test = "LRT"): Deviance, Pr(>Chi); deviance(f)
  CHECK_THAT(j["group_test"]["lr_statistic"].get<double>(), WithinRel(1.425850803, 1e-9));
  CHECK_THAT(j["group_test"]["p"].get<double>(), WithinRel(0.23244, 1e-4));
  CHECK_THAT(j["deviance"].get<double>(), WithinRel(159.6842034, 1e-9));
  CHECK(j["covariates"][1]["categories"] == std::vector<std::string>{"analyst", "clerk", "technician"});
  // The text docs/import.md shows.
  const std::string text = RunCli({"--study", study, "analyze"}).out;
  CHECK(text.find("Adjusted for covariates (logistic regression, 129 applications):\n"
                  "  The log-odds of a positive outcome on the group, years_experience (a number,\n"
                  "  linear on the log-odds scale) and role (3 categories, each against\n"
                  "  'analyst', the first in sorted order).\n"
                  "  man against woman: adjusted odds ratio 1.6, 95% profile CI [0.741, 3.55], Wald CI [0.734, 3.49], "
                  "Wald p = 0.236\n"
                  "  The group term, likelihood-ratio test against the model with the covariates\n"
                  "  only: X^2 = 1.43 on 1 df, p = 0.232.\n") != std::string::npos);
}

TEST_CASE("import applications: stage columns give the same stages as the furthest-stage column") {
  testing::TempDir dir;
  const std::string data = testing::SourceDir() + "/tests/cli/data/";
  auto stages_of = [&](const std::string& name, const std::vector<std::string>& extra) {
    std::vector<std::string> args = {"--study", dir / name, "import", "applications"};
    args.insert(args.end(), extra.begin(), extra.end());
    for (const char* a : {"--kind", "unpaired", "--reference", "woman", "--stages", "applied,screened,interview,offer,hire"})
      args.push_back(a);
    REQUIRE(RunCli(args).exit_code == 0);
    return nlohmann::json::parse(RunCli({"--study", dir / name, "--json", "analyze"}).out)["stages"];
  };
  const auto flags = stages_of("flags", {data + "hr_stage_columns.csv", "--columns", "arm=gender,vacancy=req_id"});
  const auto column = stages_of("column", {data + "hr_applications.csv", "--columns", "arm=gender,outcome=furthest_stage,vacancy=req_id"});
  CHECK(flags == column);
  CHECK(flags["stages"][4]["groups"][1]["reached"] == 14);  // men hired, as in the furthest_stage file
}

TEST_CASE("import applications: a categorical covariate of more than 50 categories is refused where the 51st appears") {
  testing::TempDir dir;
  const std::string file = dir / "many.csv";
  std::string csv = "vacancy,arm,outcome,office\n";
  for (int i = 0; i < 60; ++i) csv += "V1," + std::string(i % 2 ? "a" : "b") + ",1,office " + std::to_string(i) + "\n";
  testing::WriteFile(file, csv);
  auto r = RunCli({"--study", dir / "s", "import", "applications", file, "--kind", "unpaired", "--reference", "a",
                   "--covariates", "office"});
  CHECK(r.exit_code == 1);
  // The 51st distinct value is on line 52 (the header is line 1), column 4.
  CHECK(r.err == "twinprobe: " + file + ":52:4: the covariate 'office' has more than 50 categories (not every cell is a "
                 "number, so it is read as categories) \u2014 group its values into fewer categories, or write every cell "
                 "as a number\n");
  CHECK_FALSE(std::filesystem::exists(dir / "s/study.db"));
}

TEST_CASE("import applications: a later import keeps the covariates of the first") {
  testing::TempDir dir;
  const std::string study = dir / "s";
  const std::string first = dir / "first.csv", second = dir / "second.csv";
  testing::WriteFile(first, "vacancy,arm,outcome,years\nV1,a,1,3\nV1,b,0,4\n");
  testing::WriteFile(second, "vacancy,arm,outcome,years\nV2,a,0,5\nV2,b,1,2.5\n");
  auto import = [&](const std::string& file, const std::string& covariates) {
    std::vector<std::string> args = {"--study", study, "import", "applications", file, "--kind", "unpaired", "--reference", "a"};
    if (!covariates.empty()) args.insert(args.end(), {"--covariates", covariates});
    return RunCli(args);
  };
  REQUIRE(import(first, "years").exit_code == 0);
  auto without = import(second, "");
  CHECK(without.exit_code == 1);
  CHECK(without.err == "twinprobe: --covariates (none) differs from the study's covariates (years) \u2014 a later import "
                       "keeps the covariates of the first; give the same --covariates\n");
  auto again = import(second, "years");
  CHECK(again.exit_code == 0);
  CHECK(again.out.rfind("Added to the study from " + second + ": 2 applications in 1 vacancy.\n", 0) == 0);
  auto j = nlohmann::json::parse(RunCli({"--study", study, "--json", "analyze"}).out)["covariate_model"];
  CHECK(j["applications"] == 4);
  CHECK(j["covariates"][0]["kind"] == "numeric");
  auto v = RunCli({"--study", study, "verify"});
  CHECK(v.exit_code == 0);
}

TEST_CASE("import applications: --json says how each covariate was read") {
  testing::TempDir dir;
  const std::string file = dir / "a.csv";
  testing::WriteFile(file, "vacancy,arm,outcome,years,degree\nV1,north,1,3,master\nV1,south,0,4.5,none\nV2,north,0,+2,12\n"
                           "V2,south,1,7,none\n");
  auto r = RunCli({"--study", dir / "s", "--json", "import", "applications", file, "--kind", "unpaired", "--reference", "north",
                   "--covariates", "years,degree"});
  REQUIRE(r.exit_code == 0);
  // "+2" is a number; "12" among words makes degree categorical, "12" a category.
  CHECK(nlohmann::json::parse(r.out)["covariates"] ==
        nlohmann::json::parse(R"([{"name": "years", "kind": "numeric", "categories": null},
                                  {"name": "degree", "kind": "categorical", "categories": 3}])"));
}
