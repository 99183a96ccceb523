#pragma once
// Conditional logistic regression for matched sets: each set is one vacancy,
// each row one probe with its covariates (arm indicators, arm scores,
// interactions) and a binary outcome. Conditioning on the number of positives
// in each set removes the vacancy's own callback propensity (Breslow & Day
// 1980, Statistical Methods in Cancer Research vol. 1, IARC, ch. 7; Breslow,
// Day, Halvorsen, Prentice & Sabai 1978, Am J Epidemiol 108:299-307).
//
// Likelihood: a set with rows R and positives D (|D| = d) contributes
//   exp(sum_{i in D} x_i' beta) / sum_{S subset of R, |S| = d} exp(sum_{i in S} x_i' beta)
// (the exact conditional likelihood, several positives per set allowed). The
// denominator and its first and second derivatives are summed over subsets
// by the recursion B(k, m) = B(k, m-1) + exp(x_m' beta) B(k-1, m-1) (Gail,
// Lubin & Rubinstein 1981, Biometrika 68:703-707), O(n d p^2) per set.
// Sets with no positive or all positive carry no information and are left
// out. Maximised by Newton's method with step halving; linear systems by
// Eigen's LDLT. Same model and numbers as R's
// survival::clogit(y ~ x + strata(set), method = "exact").
//
// With two arms (pairs) and one arm indicator this is the conditional odds
// ratio b / c of the discordant pairs (Breslow & Day 1980, section 7.2).
//
// Separation (a covariate that orders every informative set's outcomes) is
// reported, not iterated, by the rule of stats/logistic.h: within some set
// the fitted linear predictors span more than 30, or no convergence in 100
// iterations.
#include <string>
#include <vector>

#include "stats/logistic.h"

namespace twinprobe::stats {

struct MatchedSetsData {
  std::vector<std::string> names;      // one per covariate column (no intercept: it cancels)
  std::vector<long> set;               // the set (vacancy) of each row; rows of a set need not be adjacent
  std::vector<std::vector<double>> x;  // rows of length names.size()
  std::vector<int> outcome;            // 0 or 1
};

struct ClogitFit {
  FitStatus status = FitStatus::kBadInput;
  std::string message;
  std::vector<double> coefficients, standard_errors, z, p_wald;
  std::vector<std::vector<double>> covariance;
  double log_likelihood = 0;       // at the estimate (R: fit$loglik[2])
  double log_likelihood_null = 0;  // at beta = 0 (R: fit$loglik[1])
  // Likelihood-ratio test of beta = 0: 2 (ll - ll_null) on p df.
  double lr_statistic = 0, lr_p = 1;
  // Wald test of beta = 0: beta' V^-1 beta on p df (R: summary()$waldtest).
  double wald_statistic = 0, wald_p = 1;
  int df = 0;
  int sets = 0;              // informative sets (at least one positive and one negative)
  int iterations = 0;
  bool ok() const { return status == FitStatus::kOk; }
};

// Requires equal lengths, finite covariates, outcomes 0/1 (else kBadInput);
// at least one informative set. Dependent columns (including a covariate
// constant within every set, such as a between-vacancy factor's main
// effect) give kSingular naming the column.
ClogitFit FitClogit(const MatchedSetsData& data);

// The conditional log likelihood at a given beta (size names.size()).
double ClogitLogLikelihood(const MatchedSetsData& data, const std::vector<double>& beta);

// Likelihood-ratio test of a nested model: 2 (ll_full - ll_reduced) on
// (p_full - p_reduced) df, chi-square upper tail. Used for a main effect or
// an interaction: fit the model with and without its columns.
LikelihoodRatio CompareNested(const ClogitFit& full, const ClogitFit& reduced);

// The same model with coefficient `fixed` held at `value` (an offset) and
// the others refitted; used by the profile interval.
ClogitFit FitClogitFixed(const MatchedSetsData& data, int fixed, double value);

// Likelihood-ratio (profile) interval of coefficient j on the log-odds
// scale: the b where 2 (ll_hat - max ll with beta_j = b) = qchisq(conf, 1),
// each limit solved to 1e-11 (TOMS 748) as stats/logistic.h's
// ProfileInterval; -inf / +inf when not reached within 40 SE. Requires
// fit.ok() from FitClogit(data).
Interval ClogitProfileInterval(const MatchedSetsData& data, const ClogitFit& fit, int j, double conf);

// Wald interval of coefficient j on the log-odds scale (exponentiate for the
// odds ratio).
Interval ClogitWaldInterval(const ClogitFit& fit, int j, double conf);

}  // namespace twinprobe::stats
