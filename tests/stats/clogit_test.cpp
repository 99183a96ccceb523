// Conditional logistic regression against R's survival::clogit(method =
// "exact") run live (tests/reference/models/clogit.R), against brute-force
// enumeration of subsets, and against the closed form for pairs.
#include <catch2/catch.hpp>

#include <cmath>
#include <map>
#include <sstream>

#include "stats/clogit.h"
#include "stats/r_run.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// A three-level within factor (ages a28, a45, a58; reference a28) and gender
// varied between vacancies. Each vacancy has its own callback propensity.
// Columns: a45, a58, a45_female, a58_female (and, with `score`, only the age
// score 28/45/58).
stats::MatchedSetsData DrawSets(uint64_t seed, int vacancies, bool score) {
  stats::Rng rng(seed);
  stats::MatchedSetsData d;
  d.names = score ? std::vector<std::string>{"age"}
                  : std::vector<std::string>{"a45", "a58", "a45_female", "a58_female"};
  const double ages[] = {28, 45, 58};
  for (int v = 0; v < vacancies; ++v) {
    const double female = v % 2;
    const double u = std::log(rng.Uniform() / (1 - rng.Uniform() + 1e-12) + 1e-12) * 0.8 - 0.7;
    for (int arm = 0; arm < 3; ++arm) {
      const double a45 = arm == 1, a58 = arm == 2;
      const double eta = u - 0.4 * a45 - 1.0 * a58 + 0.5 * a58 * female;
      d.set.push_back(1000 + v);
      d.outcome.push_back(rng.Bernoulli(1 / (1 + std::exp(-eta))) ? 1 : 0);
      if (score)
        d.x.push_back({ages[arm]});
      else
        d.x.push_back({a45, a58, a45 * female, a58 * female});
    }
  }
  return d;
}

std::string Tsv(const stats::MatchedSetsData& d) {
  std::ostringstream o;
  o.precision(17);
  o << "set\ty";
  for (size_t j = 0; j < d.names.size(); ++j) o << "\tx" << j;
  o << "\n";
  for (size_t i = 0; i < d.x.size(); ++i) {
    o << d.set[i] << "\t" << d.outcome[i];
    for (double v : d.x[i]) o << "\t" << v;
    o << "\n";
  }
  return o.str();
}

void Near(double ours, double theirs, double rel = 1e-8) {
  CHECK_THAT(ours, WithinRel(theirs, rel) || WithinAbs(theirs, 1e-12));
}

// log L by listing every subset of each set (the slow oracle).
double BruteLogLikelihood(const stats::MatchedSetsData& d, const std::vector<double>& beta) {
  std::map<long, std::vector<size_t>> sets;
  for (size_t i = 0; i < d.set.size(); ++i) sets[d.set[i]].push_back(i);
  double ll = 0;
  for (const auto& [id, rows] : sets) {
    int positives = 0;
    double num = 0;
    std::vector<double> eta;
    for (size_t i : rows) {
      double e = 0;
      for (size_t j = 0; j < beta.size(); ++j) e += d.x[i][j] * beta[j];
      eta.push_back(e);
      if (d.outcome[i]) ++positives, num += e;
    }
    if (positives == 0 || positives == static_cast<int>(rows.size())) continue;
    double den = 0;
    for (unsigned mask = 0; mask < (1u << rows.size()); ++mask) {
      if (__builtin_popcount(mask) != positives) continue;
      double e = 0;
      for (size_t r = 0; r < rows.size(); ++r)
        if (mask & (1u << r)) e += eta[r];
      den += std::exp(e);
    }
    ll += num - std::log(den);
  }
  return ll;
}

}  // namespace

TEST_CASE("clogit: 3-level within factor by between factor agrees with R clogit exact") {
  const auto d = DrawSets(20261202, 240, false);
  const auto fit = stats::FitClogit(d);
  REQUIRE(fit.ok());
  // Nested model without the two interaction columns (the interaction's LR test).
  stats::MatchedSetsData main = d;
  main.names = {"a45", "a58"};
  for (auto& row : main.x) row.resize(2);
  const auto reduced = stats::FitClogit(main);
  REQUIRE(reduced.ok());
  auto r = testing::RunRScript("clogit.R", Tsv(d), "3,4 0.95");
  for (size_t j = 0; j < 4; ++j) {
    INFO(d.names[j]);
    Near(fit.coefficients[j], r["coef"][j]);        // coef(clogit(y ~ X + strata(set), method = "exact"))
    Near(fit.standard_errors[j], r["se"][j]);       // sqrt(diag(vcov(fit)))
    const auto profile = stats::ClogitProfileInterval(d, fit, static_cast<int>(j), 0.95);
    Near(profile.low, r["profile_low"][j]);          // uniroot(tol = 1e-12) on clogit(... + offset(b x_j))
    Near(profile.high, r["profile_high"][j]);
  }
  Near(fit.log_likelihood_null, r["loglik"][0], 1e-10);  // fit$loglik[1]
  Near(fit.log_likelihood, r["loglik"][1], 1e-10);       // fit$loglik[2]
  Near(fit.lr_statistic, r["lr"][0]);                    // 2 * diff(fit$loglik)
  Near(fit.lr_p, r["lr_p"][0]);                          // summary(fit)$logtest["pvalue"]
  Near(fit.wald_statistic, r["wald"][0]);                // fit$wald.test (summary() rounds it)
  Near(fit.wald_p, r["wald_p"][0]);                      // pchisq(fit$wald.test, 4, lower.tail = FALSE)
  Near(reduced.log_likelihood, r["loglik_reduced"][0], 1e-10);  // the same without columns 3 and 4
  const auto lr = stats::CompareNested(fit, reduced);
  CHECK(lr.df == 2);
  Near(lr.statistic, 2 * (r["loglik"][1] - r["loglik_reduced"][0]), 1e-8);
}

TEST_CASE("clogit: the trend slope on age scores agrees with R clogit exact") {
  const auto d = DrawSets(11, 180, true);
  const auto fit = stats::FitClogit(d);
  REQUIRE(fit.ok());
  auto r = testing::RunRScript("clogit.R", Tsv(d), "0 0.9");
  Near(fit.coefficients[0], r["coef"][0]);
  const auto profile = stats::ClogitProfileInterval(d, fit, 0, 0.9);
  Near(profile.low, r["profile_low"][0]);  // uniroot(tol = 1e-12) on clogit(y ~ offset(b x) + strata(set))
  Near(profile.high, r["profile_high"][0]);
  Near(fit.standard_errors[0], r["se"][0]);
  Near(fit.log_likelihood, r["loglik"][1], 1e-10);
  Near(fit.lr_p, r["lr_p"][0]);
}

TEST_CASE("clogit: the recursion equals enumeration of every subset, several positives per set") {
  stats::Rng rng(5);
  stats::MatchedSetsData d;
  d.names = {"x1", "x2"};
  for (int s = 0; s < 30; ++s) {
    const int size = static_cast<int>(rng.Between(2, 7));
    for (int i = 0; i < size; ++i) {
      d.set.push_back(s);
      d.x.push_back({rng.Uniform() * 4 - 2, static_cast<double>(rng.Between(0, 1))});
      d.outcome.push_back(rng.Bernoulli(0.45) ? 1 : 0);
    }
  }
  for (std::vector<double> beta : {std::vector<double>{0, 0}, {0.7, -1.3}, {-2.5, 3.0}})
    CHECK_THAT(stats::ClogitLogLikelihood(d, beta), WithinRel(BruteLogLikelihood(d, beta), 1e-12));
}

TEST_CASE("clogit: for pairs the odds ratio is b / c of the discordant pairs") {
  // Breslow & Day (1980, vol. 1, ch. 7; from memory for the section): with
  // one binary covariate in matched pairs the conditional MLE is log(c / b),
  // SE sqrt(1/b + 1/c). Here a = 12, b = 30 (only the reference arm called
  // back), c = 10 (only the other arm), d = 48.
  stats::MatchedSetsData d;
  d.names = {"other_arm"};
  long set = 0;
  auto add = [&](int ref, int other, int count) {
    for (int i = 0; i < count; ++i, ++set) {
      d.set.insert(d.set.end(), {set, set});
      d.x.push_back({0});
      d.x.push_back({1});
      d.outcome.insert(d.outcome.end(), {ref, other});
    }
  };
  add(1, 1, 12);
  add(1, 0, 30);
  add(0, 1, 10);
  add(0, 0, 48);
  const auto fit = stats::FitClogit(d);
  REQUIRE(fit.ok());
  CHECK(fit.sets == 40);
  CHECK_THAT(fit.coefficients[0], WithinRel(std::log(10.0 / 30.0), 1e-12));
  CHECK_THAT(fit.standard_errors[0], WithinRel(std::sqrt(1.0 / 30 + 1.0 / 10), 1e-10));
}

TEST_CASE("clogit: a between-vacancy main effect is refused by name") {
  auto d = DrawSets(3, 60, false);
  d.names.push_back("female");
  for (size_t i = 0; i < d.x.size(); ++i) d.x[i].push_back(static_cast<double>((d.set[i] - 1000) % 2));
  const auto fit = stats::FitClogit(d);
  CHECK(fit.status == stats::FitStatus::kSingular);
  CHECK(fit.message ==
        "'female' does not vary within any informative set, so conditioning on the set removes it (a factor that "
        "varies between vacancies enters only through its interaction with a within factor)");
}

TEST_CASE("clogit: an arm never called back when another is is reported as separation") {
  auto d = DrawSets(4, 80, false);
  for (size_t i = 0; i < d.x.size(); ++i)
    if (d.x[i][1] == 1) d.outcome[i] = 0;  // a58 never called back
  const auto fit = stats::FitClogit(d);
  CHECK(fit.status == stats::FitStatus::kSeparation);
  INFO(fit.message);
  CHECK(fit.message.rfind("within every informative set the outcome is ordered by the covariates (separation), so "
                          "the conditional maximum-likelihood estimate does not exist; 'a58' runs off towards infinity",
                          0) == 0);
}

TEST_CASE("clogit: sets without both outcomes are refused with the reason") {
  stats::MatchedSetsData d;
  d.names = {"x"};
  d.set = {1, 1, 2, 2};
  d.x = {{0}, {1}, {0}, {1}};
  d.outcome = {0, 0, 1, 1};
  const auto fit = stats::FitClogit(d);
  CHECK(fit.status == stats::FitStatus::kBadInput);
  CHECK(fit.message == "no set has both a positive and a negative outcome, so there is nothing to compare within sets");
}
