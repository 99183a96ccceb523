// The groups' odds ratios adjusted for covariates (analysis/covariate_model.h)
// against R's glm(y ~ group + covariates, family = binomial), run live on
// applications drawn here (tests/reference/models/covariate_glm.R names
// every R call): the treatment coding of groups and categories, the grouped
// rows, the intervals and the test of the group term.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <map>
#include <sstream>

#include "analysis/covariate_model.h"
#include "stats/r_run.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

struct Drawn {
  CovariateTable table;
  std::string tsv;  // one row per application, for R
  std::vector<std::string> groups;
};

// Three groups (reference "north"), years of experience (whole numbers, so
// applications share patterns) and a degree of four categories; the outcome
// from a known logistic model.
Drawn DrawApplications(uint64_t seed, int n) {
  stats::Rng rng(seed);
  const std::vector<std::string> groups = {"north", "east", "west"};
  const std::vector<std::string> degrees = {"vocational", "bachelor", "master", "none"};
  const std::vector<double> degree_effect = {0.3, 0.6, 0.8, 0};
  std::map<std::vector<std::string>, int64_t> counts;
  std::vector<std::string> appearance;
  std::ostringstream tsv;
  tsv << "group\ty\texperience\tdegree\n";
  for (int i = 0; i < n; ++i) {
    const int g = static_cast<int>(rng.Between(0, 2));
    const int years = static_cast<int>(rng.Between(0, 15));
    const int k = static_cast<int>(rng.Between(0, 3));
    const double eta = -1.4 - 0.6 * (g == 1) - 0.2 * (g == 2) + 0.07 * years + degree_effect[static_cast<size_t>(k)];
    const bool positive = rng.Bernoulli(1 / (1 + std::exp(-eta)));
    appearance.push_back(groups[static_cast<size_t>(g)]);
    ++counts[{groups[static_cast<size_t>(g)], positive ? "invited" : "declined", std::to_string(years),
              degrees[static_cast<size_t>(k)]}];
    tsv << groups[static_cast<size_t>(g)] << "\t" << (positive ? 1 : 0) << "\t" << years << "\t"
        << degrees[static_cast<size_t>(k)] << "\n";
  }
  Drawn d;
  d.groups = {"north"};  // the reference, then the others as they first appear (the importer's order)
  for (const std::string& line : appearance)
    if (std::find(d.groups.begin(), d.groups.end(), line) == d.groups.end()) d.groups.push_back(line);
  d.table.names = {"experience", "degree"};
  for (const auto& [key, count] : counts) d.table.patterns.push_back({key[0], key[1], {key[2], key[3]}, count});
  d.tsv = tsv.str();
  return d;
}

OutcomeScheme Invited() {
  OutcomeScheme s;
  s.codes = {"declined", "invited"};
  s.positive = {"invited"};
  return s;
}

void Near(double ours, double theirs, double rel) { CHECK_THAT(ours, WithinRel(theirs, rel) || WithinAbs(theirs, 1e-10)); }

}  // namespace

TEST_CASE("covariate model: 600 applications, three groups, a number and a category, agree with R glm") {
  const Drawn d = DrawApplications(20261202, 600);
  const CovariateModel m = FitCovariateModel(d.table, d.groups, Invited(), 0.95);
  REQUIRE(m.present);
  REQUIRE(m.failure.empty());
  CHECK(m.applications == 600);
  REQUIRE(m.covariates.size() == 2);
  CHECK(m.covariates[0].numeric);
  CHECK_FALSE(m.covariates[1].numeric);
  CHECK(m.covariates[1].baseline == "bachelor");  // the first in sorted order
  CHECK(m.covariates[1].categories == std::vector<std::string>{"bachelor", "master", "none", "vocational"});
  std::vector<std::string> names;
  for (const CovariateTerm& t : m.terms) names.push_back(t.name);
  // R: names(coef(fit)) are (Intercept), groupwest, groupeast, experience,
  // degreemaster, degreenone, degreevocational: the same columns in the same
  // order ("west" appears before "east" in this draw).
  CHECK(d.groups == std::vector<std::string>{"north", "west", "east"});
  CHECK(names == std::vector<std::string>{"(Intercept)", "group: west", "group: east", "experience", "degree: master",
                                          "degree: none", "degree: vocational"});
  auto r = testing::RunRScript("covariate_glm.R", d.tsv, "0.95 north");
  REQUIRE(r["coef"].size() == m.terms.size());
  Near(m.deviance, r["deviance"][0], 1e-10);          // deviance(glm(y ~ group + experience + degree, binomial))
  Near(m.null_deviance, r["null_deviance"][0], 1e-10);  // glm(...)$null.deviance
  CHECK(m.df_residual == r["df"][0]);                   // glm(...)$df.residual
  CHECK(m.df_null == r["df"][1]);                       // glm(...)$df.null
  for (size_t j = 0; j < m.terms.size(); ++j) {
    const CovariateTerm& t = m.terms[j];
    INFO("term " << t.name);
    Near(t.coefficient, r["coef"][j], 1e-8);                  // coef(glm(...))
    Near(t.standard_error, r["se"][j], 1e-8);                 // summary(glm(...))$coefficients[, 2]
    Near(t.z, r["z"][j], 1e-8);                               // ... [, 3]
    Near(t.p_wald, r["p"][j], 1e-8);                          // ... [, 4]
    Near(t.wald_ci.low, std::exp(r["wald_low"][j]), 1e-8);    // exp(confint.default(glm(...)))
    Near(t.wald_ci.high, std::exp(r["wald_high"][j]), 1e-8);
    Near(t.odds_ratio, std::exp(r["coef"][j]), 1e-8);
  }
  for (size_t i = 0; i < 2; ++i) {
    const CovariateTerm& t = m.terms[1 + i];
    INFO("group term " << t.name);
    // uniroot(tol = 1e-12) on the profile deviance of glm(...): both solve the
    // same equation, so they agree far below 1e-8.
    Near(t.profile_ci.low, std::exp(r["profile_low"][i]), 1e-8);
    Near(t.profile_ci.high, std::exp(r["profile_high"][i]), 1e-8);
    // MASS's confint(glm(...)) interpolates the profile with a spline.
    CHECK_THAT(std::log(t.profile_ci.low), WithinAbs(r["confint_low_r"][i], 2e-3 * t.standard_error));
    CHECK_THAT(std::log(t.profile_ci.high), WithinAbs(r["confint_high_r"][i], 2e-3 * t.standard_error));
  }
  // anova(glm(y ~ experience + degree), glm(y ~ group + experience + degree), test = "LRT")
  Near(m.group_lr, r["lr"][0], 1e-8);
  CHECK(m.group_df == r["lr"][1]);
  Near(m.group_p, r["lr"][2], 1e-8);
}

TEST_CASE("covariate model: a group with no positive outcome is reported as separation, not a NaN") {
  CovariateTable t;
  t.names = {"experience"};
  t.patterns = {{"north", "invited", {"3"}, 5}, {"north", "declined", {"4"}, 7}, {"north", "invited", {"8"}, 2},
                {"east", "declined", {"2"}, 6},  {"east", "declined", {"9"}, 4}};
  const CovariateModel m = FitCovariateModel(t, {"north", "east"}, Invited(), 0.95);
  CHECK(m.present);
  CHECK(m.terms.empty());
  CHECK(m.failure.rfind("the outcome is perfectly predicted by the covariates (separation), so the maximum-likelihood "
                        "estimate does not exist; 'group: east' runs off towards infinity",
                        0) == 0);
}

TEST_CASE("covariate model: a category every application shares gets no column") {
  CovariateTable t;
  t.names = {"site"};
  t.patterns = {{"north", "invited", {"harbour"}, 5}, {"north", "declined", {"harbour"}, 7},
                {"east", "invited", {"harbour"}, 3},  {"east", "declined", {"harbour"}, 9}};
  const CovariateModel m = FitCovariateModel(t, {"north", "east"}, Invited(), 0.95);
  REQUIRE(m.failure.empty());
  REQUIRE(m.terms.size() == 2);
  // Only the group: the log odds ratio of the 2 x 2 table, log((3/9) / (5/7)).
  CHECK_THAT(m.terms[1].coefficient, WithinRel(std::log((3.0 / 9) / (5.0 / 7)), 1e-12));
}

TEST_CASE("covariate model: a study without covariates has no model") {
  CHECK_FALSE(FitCovariateModel(CovariateTable{}, {"north", "east"}, Invited(), 0.95).present);
}
