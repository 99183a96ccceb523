#pragma once
// Each group's odds ratio adjusted for the covariates kept with the
// applications (`import applications --covariates`): a logistic regression
// (binomial GLM, logit link; stats/logistic.h) of the outcome (positive or
// not) on the group and the covariates,
//   logit P(positive) = b0 + sum_g b_g [group = g] + sum_k c_k x_k,
// as R's glm(positive ~ group + x1 + x2, family = binomial) with treatment
// coding (Agresti 2013, Categorical Data Analysis, 3rd ed., ch. 5):
//   - group: one indicator per group other than the design's reference;
//   - a numeric covariate (every value a number, core/covariate_records.h):
//     one column, its value (the effect is linear on the log-odds scale);
//   - a categorical covariate: one indicator per category except the first in
//     sorted (byte) order, which is the baseline. A covariate with one
//     category carries no information and gets no column.
// exp(b_g) is group g's odds ratio against the reference with the covariates
// held fixed. Reported with Wald and profile-likelihood intervals (Venzon &
// Moolgavkar 1988) and the likelihood-ratio test of the whole group term
// (the model without the group columns as the reduced model).
//
// What the adjustment removes: differences in outcome that the listed
// covariates explain, as the model states them (additive on the log-odds
// scale). What it does not: qualifications the data do not hold, effects
// the model's form misses, and it can hide discrimination when a covariate
// is itself an outcome of the selection (a score given by the screener).
#include <cstdint>
#include <string>
#include <vector>

#include "core/covariate_records.h"
#include "core/design.h"
#include "stats/binomial.h"

namespace twinprobe {

struct CovariateColumn {
  std::string name;
  bool numeric = false;
  std::string baseline;                 // categorical: the first category in sorted order
  std::vector<std::string> categories;  // categorical: every category, sorted
};

struct CovariateTerm {
  std::string name;  // "(Intercept)", "group: beta", "exp_years", "degree: master"
  std::string kind;  // "intercept" | "group" | "numeric" | "category"
  double coefficient = 0, standard_error = 0, z = 0, p_wald = 1;
  double odds_ratio = 1;        // exp(coefficient)
  stats::Interval wald_ci;      // of the odds ratio
  stats::Interval profile_ci;   // of the odds ratio (group terms only; else = wald_ci)
};

struct CovariateModel {
  bool present = false;  // the study has covariates and applications carrying them
  std::string failure;   // why the model could not be fitted ("" when it was)
  std::vector<CovariateColumn> covariates;
  int64_t applications = 0;          // in the model
  int64_t applications_without = 0;  // left out: a covariate value missing
  std::vector<CovariateTerm> terms;  // intercept, groups, covariates, in column order
  double deviance = 0, null_deviance = 0;
  int df_residual = 0, df_null = 0;
  // Likelihood-ratio test of the group term (all group indicators at once).
  double group_lr = 0, group_p = 1;
  int group_df = 0;
};

// `arm_labels`: reference first. Requires 0 < confidence < 1. present =
// false when table.names is empty. A fit that fails (separation, collinear
// columns, one outcome only) sets `failure` to a sentence and no terms.
CovariateModel FitCovariateModel(const CovariateTable& table, const std::vector<std::string>& arm_labels,
                                 const OutcomeScheme& scheme, double confidence);

}  // namespace twinprobe
