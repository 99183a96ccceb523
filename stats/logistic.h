#pragma once
// Logistic regression (binomial GLM with the logit link) by maximum
// likelihood, for adjusting a group's odds ratio for job-relevant covariates.
//
// Model: successes_i ~ Binomial(trials_i, mu_i), logit(mu_i) = x_i' beta
// (McCullagh & Nelder 1989, Generalized Linear Models, 2nd ed., ch. 4).
// Fitted by Newton's method, which for the canonical logit link is Fisher
// scoring / iteratively reweighted least squares (McCullagh & Nelder 1989,
// section 2.5): beta += (X'WX)^-1 X'(s - m mu), W = diag(m mu (1 - mu)), with
// step halving when the deviance rises. The linear systems are solved by
// Eigen's LDLT (no hand-written inversion). Converged when the deviance
// changes by less than 1e-14 relative and the last step is below 1e-9
// (relative), so beta is at full precision (R's glm stops at a deviance change
// of 1e-8, so the tests run R with glm.control(epsilon = 1e-30): to the last bit).
//
// Outputs as R's glm(cbind(s, m - s) ~ X - 1, family = binomial) and
// summary(): coefficients, standard errors sqrt(diag((X'WX)^-1)), Wald z and
// two-sided p, Wald intervals beta -+ qnorm(1 - (1-conf)/2) SE, the residual
// deviance 2 sum [s log(s / m mu) + (m - s) log((m - s) / (m (1 - mu)))]
// and the null deviance (intercept-only model when X has a constant column,
// else mu = 1/2 as R).
//
// Separation (Albert & Anderson 1984, Biometrika 71:1-10): when a linear
// combination of the covariates predicts the outcome perfectly (completely
// or quasi-completely), the maximum-likelihood estimate does not exist and
// Newton's method walks off to infinity. It is detected, not iterated: when a
// fitted linear predictor |x_i' beta| exceeds 30 (a fitted probability within
// 1e-13 of 0 or 1, where R's glm warns "fitted probabilities numerically 0 or
// 1 occurred") while the deviance is still falling, or the fit does not
// converge in 100 iterations, the status is kSeparation and the message names
// the covariate whose coefficient moves the fitted values most.
#include <cstdint>
#include <string>
#include <vector>

#include "stats/binomial.h"

namespace twinprobe::stats {

// One row per observation (or per group of observations sharing covariates).
struct LogisticData {
  std::vector<std::string> names;          // one per column of x
  std::vector<std::vector<double>> x;      // rows of length names.size(); include a 1 column for an intercept
  std::vector<double> successes;           // s_i in [0, trials_i]
  std::vector<double> trials;              // m_i > 0 (1 for one application per row)
};

enum class FitStatus { kOk, kSeparation, kSingular, kBadInput };

struct LogisticFit {
  FitStatus status = FitStatus::kBadInput;
  std::string message;  // why the fit failed (empty when kOk)
  std::vector<double> coefficients, standard_errors, z, p_wald;
  std::vector<std::vector<double>> covariance;  // (X'WX)^-1
  double deviance = 0, null_deviance = 0;
  double log_likelihood = 0;  // sum of binomial log densities (R's logLik)
  int df_residual = 0, df_null = 0;
  int iterations = 0;
  bool ok() const { return status == FitStatus::kOk; }
};

// Requires rectangular x with as many rows as successes and trials. Bad
// shapes, trials <= 0 or successes outside [0, trials] give kBadInput;
// linearly dependent columns give kSingular.
LogisticFit FitLogistic(const LogisticData& data);

// The same model with the coefficient of column `fixed` held at `value`
// (an offset) and the others refitted; used by the profile interval.
LogisticFit FitLogisticFixed(const LogisticData& data, int fixed, double value);

// Wald interval for coefficient j: beta_j -+ qnorm(1 - (1-conf)/2) SE_j (R's
// confint.default). Requires fit.ok().
Interval WaldInterval(const LogisticFit& fit, int j, double conf);

// Likelihood-ratio (profile) interval for coefficient j (Venzon & Moolgavkar
// 1988, Applied Statistics 37:87-94): the values b where the profile deviance
// D(b) = min over the other coefficients of the deviance with beta_j = b
// satisfies D(b) - D(beta_hat) = qchisq(conf, 1). Each limit is solved to
// 1e-10 by a bracketing root finder (TOMS 748) on the signed root
// sign(b - beta_j) sqrt(D(b) - D_hat), the quantity MASS's profile.glm
// tabulates. R's confint() (MASS on R 4.2) interpolates that table with a
// spline, so it agrees to about 1e-4; tests compare with R solving the same
// equation with uniroot(tol = 1e-12). A limit is -inf / +inf when the
// profile deviance never reaches the cut-off on that side (|b| up to 40 from
// the estimate in SE units). Requires fit.ok() from FitLogistic(data).
Interval ProfileInterval(const LogisticData& data, const LogisticFit& fit, int j, double conf);

// A likelihood-ratio test of a nested model (chi-square upper tail).
struct LikelihoodRatio {
  double statistic = 0;
  int df = 0;
  double p = 1;
};

// The reduced model's deviance minus the full model's, on the difference in
// residual df: e.g. a 3-level group's overall adjusted test, fitting with and
// without its two indicator columns (R: anova(reduced, full, test = "LRT")).
// Requires both fits ok() on the same rows.
LikelihoodRatio CompareNested(const LogisticFit& full, const LogisticFit& reduced);

// The column index of `name`, or -1.
int CoefficientIndex(const LogisticData& data, const std::string& name);

}  // namespace twinprobe::stats
