#pragma once
// The arm effect adjusted for template and send position: a conditional
// logistic regression of the outcome on arm indicators plus template and
// send-position indicators, with one stratum per vacancy (the set). The
// plan balances templates and positions across arms; this model estimates
// their effects instead of only relying on the balance, so a reader sees
// whether the arm's odds ratio moves when they are held fixed. Conditioning
// on the set removes everything constant within a vacancy (employer,
// occupation, region), so stratum terms need no column.
//
// Model (Breslow & Day 1980, Statistical Methods in Cancer Research vol. 1,
// IARC, ch. 7; stats/clogit.h): R's
//   survival::clogit(y ~ arm + template + position + strata(set), method = "exact")
// with treatment coding: baselines are the reference arm, the first template
// in sorted order and send position 1. Terms constant across the data (one
// template only, imported sets without positions) are left out; when the
// columns are linearly dependent within sets (a group of terms confounded
// with the arms), send position and then template are left out and named.
#include <cstdint>
#include <string>
#include <vector>

#include "stats/binomial.h"

namespace twinprobe {

struct LaidOutProbe {
  int arm = 0;  // index into the arm labels, 0 = reference
  bool positive = false;
  std::string template_path;  // "" when none
  int send_order = 1;
};

struct AdjustedTerm {
  std::string name;  // "arm: origin=inland", "template: cv_b.md", "send position 2"
  std::string kind;  // "arm" | "template" | "position"
  double coefficient = 0, standard_error = 0, odds_ratio = 1, p_wald = 1;
  stats::Interval ci;  // profile interval of the odds ratio
};

struct AdjustedModel {
  bool present = false;  // matched sets with at least one informative set
  std::string failure;   // why the fit failed ("" when it ran)
  int sets = 0;          // informative sets
  std::vector<AdjustedTerm> terms;  // arms, then templates, then positions
  // Likelihood-ratio test of all template and position terms together (the
  // model with arms only as the reduced model); df 0 when there are none.
  double nuisance_lr = 0, nuisance_p = 1;
  int nuisance_df = 0;
  // Groups of terms left out because they are confounded with the arms
  // (e.g. imported sets whose send order follows the arm): "send position",
  // "template". The model is then fitted without them.
  std::vector<std::string> left_out;
};

// `sets`: the complete sets, one entry per vacancy. Requires 0 < confidence
// < 1. Returns present = false when no set has two probes.
AdjustedModel FitAdjustedModel(const std::vector<std::vector<LaidOutProbe>>& sets,
                               const std::vector<std::string>& arm_labels, double confidence);

}  // namespace twinprobe
