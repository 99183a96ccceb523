#include "analysis/covariate_model.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "stats/logistic.h"

namespace twinprobe {
namespace {

// How each covariate enters the model, from the values the applications hold.
std::vector<CovariateColumn> DescribeCovariates(const CovariateTable& table) {
  std::vector<CovariateColumn> out;
  for (size_t k = 0; k < table.names.size(); ++k) {
    CovariateColumn c;
    c.name = table.names[k];
    std::set<std::string> values;
    bool numeric = true;
    for (const CovariatePattern& p : table.patterns) {
      values.insert(p.values[k]);
      if (!CovariateNumber(p.values[k])) numeric = false;
    }
    c.numeric = numeric;
    if (!numeric) {
      c.categories.assign(values.begin(), values.end());  // std::set: sorted by bytes
      if (!c.categories.empty()) c.baseline = c.categories.front();
    }
    out.push_back(std::move(c));
  }
  return out;
}

}  // namespace

CovariateModel FitCovariateModel(const CovariateTable& table, const std::vector<std::string>& arm_labels,
                                 const OutcomeScheme& scheme, double confidence) {
  CovariateModel m;
  if (table.names.empty() || arm_labels.size() < 2) return m;
  m.present = true;
  m.applications_without = table.applications_without;
  m.covariates = DescribeCovariates(table);

  stats::LogisticData data;
  std::vector<std::string> kinds;
  data.names.push_back("(Intercept)");
  kinds.push_back("intercept");
  for (size_t g = 1; g < arm_labels.size(); ++g) {
    data.names.push_back("group: " + arm_labels[g]);
    kinds.push_back("group");
  }
  const size_t first_covariate_column = data.names.size();
  for (const CovariateColumn& c : m.covariates) {
    if (c.numeric) {
      data.names.push_back(c.name);
      kinds.push_back("numeric");
    } else {
      for (size_t i = 1; i < c.categories.size(); ++i) {
        data.names.push_back(c.name + ": " + c.categories[i]);
        kinds.push_back("category");
      }
    }
  }
  std::map<std::string, size_t> arm_index;
  for (size_t g = 0; g < arm_labels.size(); ++g) arm_index.emplace(arm_labels[g], g);
  // One row per pattern: its applications share group, covariates and
  // (positive or not) outcome, so successes are 0 or all of them and the
  // deviance is that of one Bernoulli row per application, as R's glm on
  // the applications themselves.
  for (const CovariatePattern& p : table.patterns) {
    auto it = arm_index.find(p.arm);
    if (it == arm_index.end()) continue;
    std::vector<double> x(data.names.size(), 0.0);
    x[0] = 1;
    if (it->second > 0) x[it->second] = 1;
    size_t col = first_covariate_column;
    for (size_t k = 0; k < m.covariates.size(); ++k) {
      const CovariateColumn& c = m.covariates[k];
      if (c.numeric) {
        x[col++] = *CovariateNumber(p.values[k]);
        continue;
      }
      for (size_t i = 1; i < c.categories.size(); ++i) x[col++] = p.values[k] == c.categories[i] ? 1.0 : 0.0;
    }
    data.x.push_back(std::move(x));
    const double n = static_cast<double>(p.applications);
    data.trials.push_back(n);
    data.successes.push_back(scheme.is_positive(p.code) ? n : 0.0);
    m.applications += p.applications;
  }
  if (m.applications == 0) {
    m.failure = "no application carries every covariate";
    return m;
  }
  const stats::LogisticFit fit = stats::FitLogistic(data);
  if (!fit.ok()) {
    m.failure = fit.message;
    return m;
  }
  m.deviance = fit.deviance;
  m.null_deviance = fit.null_deviance;
  // Degrees of freedom of one row per application (R's glm on the
  // applications), not of the grouped rows the fit ran on.
  m.df_residual = static_cast<int>(m.applications) - static_cast<int>(data.names.size());
  m.df_null = static_cast<int>(m.applications) - 1;
  for (size_t j = 0; j < data.names.size(); ++j) {
    CovariateTerm t;
    t.name = data.names[j];
    t.kind = kinds[j];
    t.coefficient = fit.coefficients[j];
    t.standard_error = fit.standard_errors[j];
    t.z = fit.z[j];
    t.p_wald = fit.p_wald[j];
    t.odds_ratio = std::exp(t.coefficient);
    const stats::Interval wald = stats::WaldInterval(fit, static_cast<int>(j), confidence);
    t.wald_ci = {std::exp(wald.low), std::exp(wald.high)};
    t.profile_ci = t.wald_ci;
    if (t.kind == "group") {
      // The profile interval costs a root search of refits per limit; the
      // groups are what the report is about.
      const stats::Interval profile = stats::ProfileInterval(data, fit, static_cast<int>(j), confidence);
      t.profile_ci = {std::exp(profile.low), std::exp(profile.high)};
    }
    m.terms.push_back(std::move(t));
  }
  // The reduced model: the same rows without the group columns.
  stats::LogisticData reduced;
  reduced.names.push_back(data.names[0]);
  for (size_t j = first_covariate_column; j < data.names.size(); ++j) reduced.names.push_back(data.names[j]);
  reduced.successes = data.successes;
  reduced.trials = data.trials;
  for (const auto& row : data.x) {
    std::vector<double> r{row[0]};
    r.insert(r.end(), row.begin() + static_cast<long>(first_covariate_column), row.end());
    reduced.x.push_back(std::move(r));
  }
  const stats::LogisticFit without = stats::FitLogistic(reduced);
  if (without.ok()) {
    const stats::LikelihoodRatio lr = stats::CompareNested(fit, without);
    m.group_lr = lr.statistic;
    m.group_df = lr.df;
    m.group_p = lr.p;
  } else {
    m.failure = "the model without the groups could not be fitted: " + without.message;
    m.terms.clear();
  }
  return m;
}

}  // namespace twinprobe
