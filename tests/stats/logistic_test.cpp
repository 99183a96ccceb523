// Logistic regression against R's glm(family = binomial), run live on data
// drawn here (tests/reference/models/logistic.R names every R call), and
// separation reported rather than iterated.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "stats/logistic.h"
#include "stats/r_run.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;
using Catch::Matchers::WithinAbs;

namespace {

// Applications with an intercept, a three-level group (reference "a28"),
// years of experience and a degree flag; outcome from a known logistic model.
stats::LogisticData DrawApplications(uint64_t seed, int n) {
  stats::Rng rng(seed);
  stats::LogisticData d;
  d.names = {"(Intercept)", "group_a45", "group_a58", "experience", "degree"};
  for (int i = 0; i < n; ++i) {
    const int group = static_cast<int>(rng.Between(0, 2));
    const double experience = std::round(200 * rng.Uniform()) / 10;
    const double degree = rng.Bernoulli(0.4) ? 1 : 0;
    const double eta = -1.2 - 0.5 * (group == 1) - 0.9 * (group == 2) + 0.06 * experience + 0.7 * degree;
    d.x.push_back({1, group == 1 ? 1.0 : 0.0, group == 2 ? 1.0 : 0.0, experience, degree});
    d.successes.push_back(rng.Bernoulli(1 / (1 + std::exp(-eta))) ? 1 : 0);
    d.trials.push_back(1);
  }
  return d;
}

std::string Tsv(const stats::LogisticData& d) {
  std::ostringstream o;
  o.precision(17);
  o << "s\tm";
  for (size_t j = 0; j < d.names.size(); ++j) o << "\tx" << j;
  o << "\n";
  for (size_t i = 0; i < d.x.size(); ++i) {
    o << d.successes[i] << "\t" << d.trials[i];
    for (double v : d.x[i]) o << "\t" << v;
    o << "\n";
  }
  return o.str();
}

// Every quantity of the fit against R's, 1e-8 relative (1e-10 absolute near 0).
void CheckAgainstR(const stats::LogisticData& d, double conf) {
  const stats::LogisticFit fit = stats::FitLogistic(d);
  REQUIRE(fit.ok());
  std::ostringstream conf_arg;
  conf_arg << conf;
  auto r = testing::RunRScript("logistic.R", Tsv(d), conf_arg.str());
  const size_t p = d.names.size();
  REQUIRE(r["coef"].size() == p);
  auto near = [](double ours, double theirs, double rel) {
    CHECK_THAT(ours, WithinRel(theirs, rel) || WithinAbs(theirs, 1e-10));
  };
  near(fit.deviance, r["deviance"][0], 1e-10);              // deviance(glm(...))
  near(fit.null_deviance, r["null_deviance"][0], 1e-10);    // glm(...)$null.deviance
  near(fit.log_likelihood, r["loglik"][0], 1e-10);          // logLik(glm(...))
  CHECK(fit.df_residual == r["df"][0]);
  CHECK(fit.df_null == r["df"][1]);
  for (size_t j = 0; j < p; ++j) {
    INFO("coefficient " << d.names[j]);
    near(fit.coefficients[j], r["coef"][j], 1e-8);           // coef(glm(...))
    near(fit.standard_errors[j], r["se"][j], 1e-8);         // summary(glm(...))$coefficients[, 2]
    near(fit.z[j], r["z"][j], 1e-8);                        // ... [, 3]
    near(fit.p_wald[j], r["p"][j], 1e-8);                   // ... [, 4]
    const auto wald = stats::WaldInterval(fit, static_cast<int>(j), conf);
    near(wald.low, r["wald_low"][j], 1e-8);                  // confint.default(glm(...))
    near(wald.high, r["wald_high"][j], 1e-8);
    const auto profile = stats::ProfileInterval(d, fit, static_cast<int>(j), conf);
    near(profile.low, r["profile_low"][j], 1e-8);            // uniroot(tol = 1e-12) on the profile deviance
    near(profile.high, r["profile_high"][j], 1e-8);
    // MASS's confint() interpolates the profile with a spline: about 1e-4.
    CHECK_THAT(profile.low, WithinAbs(r["confint_low_r"][j], 2e-3 * fit.standard_errors[j] + 1e-6));
    CHECK_THAT(profile.high, WithinAbs(r["confint_high_r"][j], 2e-3 * fit.standard_errors[j] + 1e-6));
  }
}

}  // namespace

TEST_CASE("logistic: 400 applications, group and covariates, agree with R glm and confint") {
  CheckAgainstR(DrawApplications(20261202, 400), 0.95);
}

TEST_CASE("logistic: the group's overall likelihood-ratio test agrees with R anova") {
  const auto d = DrawApplications(20261202, 400);
  stats::LogisticData reduced = d;
  reduced.names = {"(Intercept)", "experience", "degree"};
  for (auto& row : reduced.x) row = {row[0], row[3], row[4]};
  const auto full_fit = stats::FitLogistic(d), reduced_fit = stats::FitLogistic(reduced);
  REQUIRE(full_fit.ok());
  REQUIRE(reduced_fit.ok());
  const auto lr = stats::CompareNested(full_fit, reduced_fit);
  auto r = testing::RunRScript("logistic.R", Tsv(d), "0.95 2,3");
  // anova(glm(... without the group), glm(...), test = "LRT"): Deviance, Df, Pr(>Chi)
  CHECK_THAT(lr.statistic, WithinRel(r["lr"][0], 1e-9));
  CHECK(lr.df == r["lr"][1]);
  CHECK_THAT(lr.p, WithinRel(r["lr"][2], 1e-9));
}

TEST_CASE("logistic: a second draw at 90% agrees with R glm and confint") {
  CheckAgainstR(DrawApplications(7, 250), 0.90);
}

TEST_CASE("logistic: grouped rows (successes out of trials) agree with R glm") {
  stats::Rng rng(99);
  stats::LogisticData d;
  d.names = {"(Intercept)", "group_other", "score"};
  for (int i = 0; i < 12; ++i) {
    const double group = i % 2, score = i / 2;
    const double trials = static_cast<double>(rng.Between(20, 60));
    const double mu = 1 / (1 + std::exp(-(-0.8 - 0.6 * group + 0.15 * score)));
    double s = 0;
    for (int t = 0; t < trials; ++t) s += rng.Bernoulli(mu);
    d.x.push_back({1, group, score});
    d.successes.push_back(s);
    d.trials.push_back(trials);
  }
  CheckAgainstR(d, 0.99);
}

TEST_CASE("logistic: a group with no positive outcome is reported as separation") {
  stats::LogisticData d = DrawApplications(3, 200);
  for (size_t i = 0; i < d.x.size(); ++i)
    if (d.x[i][2] == 1) d.successes[i] = 0;  // nobody in a58 called back: quasi-complete separation
  const auto fit = stats::FitLogistic(d);
  CHECK(fit.status == stats::FitStatus::kSeparation);
  CHECK(fit.message.rfind("the outcome is perfectly predicted by the covariates (separation), so the "
                          "maximum-likelihood estimate does not exist; 'group_a58' runs off towards infinity (",
                          0) == 0);
}

TEST_CASE("logistic: an outcome set by a threshold on one covariate is reported as separation") {
  stats::LogisticData d;
  d.names = {"(Intercept)", "experience"};
  for (int i = 0; i < 20; ++i) {
    d.x.push_back({1, static_cast<double>(i)});
    d.successes.push_back(i >= 10 ? 1 : 0);
    d.trials.push_back(1);
  }
  const auto fit = stats::FitLogistic(d);
  CHECK(fit.status == stats::FitStatus::kSeparation);
  INFO(fit.message);
  CHECK(fit.message.find("'experience' runs off towards infinity") != std::string::npos);
}

TEST_CASE("logistic: a repeated column is refused as linearly dependent") {
  stats::LogisticData d = DrawApplications(5, 50);
  d.names.push_back("degree_again");
  for (auto& row : d.x) row.push_back(row[4]);
  const auto fit = stats::FitLogistic(d);
  CHECK(fit.status == stats::FitStatus::kSingular);
  CHECK(fit.message == "the covariates are linearly dependent (a column repeats or is a combination of others)");
}

TEST_CASE("logistic: a row with more successes than trials is refused") {
  stats::LogisticData d;
  d.names = {"(Intercept)"};
  d.x = {{1}, {1}};
  d.successes = {1, 3};
  d.trials = {1, 2};
  const auto fit = stats::FitLogistic(d);
  CHECK(fit.status == stats::FitStatus::kBadInput);
  CHECK(fit.message == "row 2 needs trials > 0 and 0 <= successes <= trials");
}
