#include "report/covariate_model_report.h"

#include <cmath>
#include <sstream>

#include "report/effects_report.h"
#include "report/html_parts.h"
#include "report/html_table.h"
#include "report/json_number.h"
#include "report/p_value.h"
#include "report/plural.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Fmt(double v) { return FormatEstimate(v); }
std::string Ci(const stats::Interval& ci) { return FormatInterval(ci); }

// "a, b and c"
std::string ListWords(const std::vector<std::string>& v) {
  std::string s;
  for (size_t i = 0; i < v.size(); ++i) s += (i == 0 ? "" : i + 1 == v.size() ? " and " : ", ") + v[i];
  return s;
}

// "the group, exp_years (a number, linear on the log-odds scale) and degree
// (4 categories, each against 'bachelor', the first in sorted order)"
std::string CovariateList(const CovariateModel& m) {
  std::vector<std::string> words = {"the group"};
  for (const CovariateColumn& c : m.covariates)
    words.push_back(c.numeric ? c.name + " (a number, linear on the log-odds scale)"
                              : c.name + " (" + Count(static_cast<int64_t>(c.categories.size()), "category", "categories") +
                                    ", each against '" + c.baseline + "', the first in sorted order)");
  return ListWords(words);
}

std::string GroupName(const std::string& term) { return term.rfind("group: ", 0) == 0 ? term.substr(7) : term; }

}  // namespace

std::string CovariateAdjustmentRemoves(const CovariateModel& m) {
  std::vector<std::string> names;
  for (const CovariateColumn& c : m.covariates) names.push_back(c.name);
  return "The adjustment removes the part of the groups' difference that " + ListWords(names) +
         " explain, as the model states it: each covariate shifts the log-odds of a positive outcome by the same "
         "amount in every group (additive on the log-odds scale, no interactions).";
}

std::string CovariateAdjustmentKeeps() {
  return "It does not remove differences in qualifications the data do not hold, nor effects the model's form misses. "
         "A covariate that is itself an outcome of the selection (a score given by the screener, a rating after an "
         "interview) can hide discrimination rather than explain it: adjust only for what was fixed before the "
         "selection.";
}

std::string RenderCovariateModelText(const AnalysisResult& r) {
  const CovariateModel& m = r.covariate_model;
  if (!m.present) return "";
  std::ostringstream o;
  o << "\nAdjusted for covariates (logistic regression, " << Count(m.applications, "application", "applications")
    << "):\n";
  o << Wrap("The log-odds of a positive outcome on " + CovariateList(m) + ".", "  ");
  if (m.applications_without > 0)
    o << Wrap(Count(m.applications_without, "application lacks", "applications lack") +
                  " a covariate value and is left out of this model.",
              "  ");
  if (!m.failure.empty()) {
    o << Wrap("The model could not be fitted: " + m.failure + ".", "  ");
    return o.str();
  }
  const int conf = static_cast<int>(std::lround(r.confidence * 100));
  for (const CovariateTerm& t : m.terms) {
    if (t.kind != "group") continue;
    o << "  " << GroupName(t.name) << " against " << (r.arms.empty() ? "the reference" : r.arms[0].label)
      << ": adjusted odds ratio " << Fmt(t.odds_ratio) << ", " << conf << "% profile CI " << Ci(t.profile_ci) << ", Wald CI "
      << Ci(t.wald_ci) << ", Wald " << PEquals(t.p_wald) << "\n";
  }
  o << Wrap("The group term, likelihood-ratio test against the model with the covariates only: X^2 = " + Fmt(m.group_lr) +
                " on " + std::to_string(m.group_df) + " df, " + PEquals(m.group_p) + ".",
            "  ");
  o << Wrap(CovariateAdjustmentRemoves(m) + " " + CovariateAdjustmentKeeps(), "  ");
  return o.str();
}

nlohmann::json CovariateModelJson(const CovariateModel& m) {
  nlohmann::json j{{"method", "logistic regression (binomial GLM, logit link), treatment coding"},
                   {"applications", m.applications},
                   {"applications_without_covariates", m.applications_without}};
  j["covariates"] = nlohmann::json::array();
  for (const CovariateColumn& c : m.covariates)
    j["covariates"].push_back({{"name", c.name},
                               {"kind", c.numeric ? "numeric" : "categorical"},
                               {"baseline", c.numeric ? nlohmann::json(nullptr) : nlohmann::json(c.baseline)},
                               {"categories", c.categories}});
  if (!m.failure.empty()) {
    j["failure"] = m.failure;
    return j;
  }
  j["terms"] = nlohmann::json::array();
  for (const CovariateTerm& t : m.terms) {
    nlohmann::json x{{"term", t.name},
                     {"kind", t.kind},
                     {"coefficient", JsonNumber(t.coefficient)},
                     {"standard_error", JsonNumber(t.standard_error)},
                     {"z", JsonNumber(t.z)},
                     {"p_wald", JsonNumber(t.p_wald)},
                     {"odds_ratio", JsonNumber(t.odds_ratio)},
                     {"wald_conf_int", nlohmann::json::array({JsonNumber(t.wald_ci.low), JsonNumber(t.wald_ci.high)})}};
    if (t.kind == "group")
      x["profile_conf_int"] = nlohmann::json::array({JsonNumber(t.profile_ci.low), JsonNumber(t.profile_ci.high)});
    j["terms"].push_back(x);
  }
  j["deviance"] = JsonNumber(m.deviance);
  j["null_deviance"] = JsonNumber(m.null_deviance);
  j["df_residual"] = m.df_residual;
  j["df_null"] = m.df_null;
  j["group_test"] = {{"lr_statistic", JsonNumber(m.group_lr)}, {"df", m.group_df}, {"p", JsonNumber(m.group_p)}};
  j["removes"] = CovariateAdjustmentRemoves(m);
  j["does_not_remove"] = CovariateAdjustmentKeeps();
  return j;
}

std::string CovariateModelPart(const AnalysisResult& r, const ReportContext&) {
  const CovariateModel& m = r.covariate_model;
  std::string o = html::Para("A logistic regression of a positive outcome on " + CovariateList(m) +
                             ", over " + Count(m.applications, "application", "applications") +
                             ". Each group's odds ratio against the reference below is the one with these covariates "
                             "held fixed; compare it with the unadjusted comparison above.");
  if (m.applications_without > 0)
    o += html::Para(Count(m.applications_without, "application lacks", "applications lack") +
                    " a covariate value and is left out of this model.");
  if (!m.failure.empty()) return o + html::Para("The model could not be fitted: " + m.failure + ".");
  const std::string conf = std::to_string(static_cast<int>(std::lround(r.confidence * 100))) + "%";
  HtmlTable t;
  t.caption = "Adjusted odds ratios (logistic regression; " + conf + " intervals)";
  t.headers = {"term", "odds ratio", "profile interval", "Wald interval", "Wald p"};
  for (const CovariateTerm& x : m.terms) {
    if (x.kind == "intercept") continue;
    t.rows.push_back({HeadCell(x.kind == "group" ? GroupName(x.name) + " against " + (r.arms.empty() ? "" : r.arms[0].label)
                                                 : x.name),
                      NumCell(Fmt(x.odds_ratio)), NumCell(x.kind == "group" ? Ci(x.profile_ci) : ""),
                      NumCell(Ci(x.wald_ci)), NumCell(FormatP(x.p_wald))});
  }
  o += RenderTable(t);
  o += html::Para("The group term, likelihood-ratio test against the model with the covariates only: X^2 = " +
                  Fmt(m.group_lr) + " on " + std::to_string(m.group_df) + " df, " + PEquals(m.group_p) + ".");
  o += html::Para(CovariateAdjustmentRemoves(m));
  o += html::Para(CovariateAdjustmentKeeps());
  return o;
}

}  // namespace twinprobe
