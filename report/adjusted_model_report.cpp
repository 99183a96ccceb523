#include "report/adjusted_model_report.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "report/effects_report.h"
#include "report/json_number.h"
#include "report/p_value.h"
#include "report/plural.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Fmt(double v) { return FormatEstimate(v); }

}  // namespace

std::string RenderAdjustedText(const AnalysisResult& r) {
  const AdjustedModel& m = r.adjusted;
  if (!m.present) return "";
  std::ostringstream o;
  o << "\nAdjusted for template and send position (conditional logistic regression, one stratum per vacancy, "
    << Count(m.sets, "informative set", "informative sets")
    << "; odds ratios against the reference arm, the first template and send position 1):\n";
  if (!m.failure.empty()) {
    o << "  the model could not be fitted: " << m.failure << ".\n";
    return o.str();
  }
  const int conf = static_cast<int>(std::lround(r.confidence * 100));
  for (const std::string& group : m.left_out)
    o << Wrap("Left out: " + group + ", which is confounded with the arms in these sets (it cannot be told apart from them).", "  ");
  for (const AdjustedTerm& t : m.terms)
    o << "  " << t.name << ": odds ratio " << Fmt(t.odds_ratio) << ", " << conf << "% profile CI [" << Fmt(t.ci.low)
      << ", " << Fmt(t.ci.high) << "], Wald " << PEquals(t.p_wald) << "\n";
  if (m.nuisance_df > 0)
    o << Wrap("Template and send position together, likelihood-ratio test against the model with arms only: X^2 = " +
                  Fmt(m.nuisance_lr) + " on " + std::to_string(m.nuisance_df) + " df, " + PEquals(m.nuisance_p) + ".",
              "  ");
  return o.str();
}

nlohmann::json AdjustedJson(const AdjustedModel& m) {
  nlohmann::json j{{"method", "conditional logistic regression (exact conditional likelihood), strata = vacancies"},
                   {"informative_sets", m.sets}};
  if (!m.failure.empty()) j["failure"] = m.failure;
  j["left_out"] = m.left_out;
  j["terms"] = nlohmann::json::array();
  for (const AdjustedTerm& t : m.terms)
    j["terms"].push_back({{"term", t.name},
                          {"kind", t.kind},
                          {"coefficient", JsonNumber(t.coefficient)},
                          {"standard_error", JsonNumber(t.standard_error)},
                          {"odds_ratio", JsonNumber(t.odds_ratio)},
                          {"conf_int", nlohmann::json::array({JsonNumber(t.ci.low), JsonNumber(t.ci.high)})},
                          {"p_wald", JsonNumber(t.p_wald)}});
  j["template_and_position_test"] = {{"lr_statistic", JsonNumber(m.nuisance_lr)},
                                     {"df", m.nuisance_df},
                                     {"p", JsonNumber(m.nuisance_p)}};
  return j;
}

}  // namespace twinprobe
