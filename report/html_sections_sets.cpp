// HTML parts for designs beyond one two-level factor (analysis/k_level.h),
// the adjusted model (analysis/adjusted_model.h) and the employers of a
// sets design (analysis/employer_sets.h).
#include <cmath>
#include <cstdio>

#include "report/effects_report.h"
#include "report/html_escape.h"
#include "report/html_parts.h"
#include "report/html_sections.h"
#include "report/html_table.h"
#include "report/k_level_report.h"
#include "report/p_value.h"
#include "report/plain_summary.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Fmt(double v) { return FormatEstimate(v); }
std::string Ci(const stats::Interval& ci) { return FormatInterval(ci); }

}  // namespace

std::string LevelTests(const AnalysisResult& r, const ReportContext&) {
  std::string o;
  for (const FactorAnalysis& f : r.k_levels.factors) {
    HtmlTable t;
    if (r.records) {  // groups of real applications: no callback, no probe
      t.caption = "Positive outcomes by group of " + f.label;
      t.headers = {"group", "positive", "applications", "rate"};
    } else {
      t.caption = "Positive callbacks by level of " + f.label + (f.within ? " (varied within sets)" : " (varied between vacancies)");
      t.headers = {"level", "positive", "probes", "rate"};
    }
    for (const LevelRate& l : f.levels)
      t.rows.push_back({HeadCell(LevelShown(l)), NumCell(std::to_string(l.positive)), NumCell(std::to_string(l.probes)),
                        NumCell(FormatPercent(l.rate))});
    o += RenderTable(t);
    if (const std::string s = OverallSentence(f, r.alpha, r.records); !s.empty()) o += html::Para(s);
    if (const std::string s = VacancyTestSentence(f, r.alpha); !s.empty()) o += html::Para(s);
    if (const std::string s = TrendSentence(f, r.alpha, r.confidence); !s.empty()) o += html::Para(s);
  }
  return o;
}

std::string LevelPairs(const AnalysisResult& r, const ReportContext&) {
  std::string o;
  const std::string conf = std::to_string(static_cast<int>(std::lround(r.confidence * 100))) + "%";
  for (const FactorAnalysis& f : r.k_levels.factors) {
    if (f.pairwise.empty()) continue;
    HtmlTable t;
    if (f.within) {
      t.caption = "Every pair of " + f.label + " levels: the sets' paired table, net discrimination and the exact McNemar "
                  "test (two-sided; adjusted by " + r.effects.correction + ")";
      t.headers = {"comparison", "rates", "both", "only first", "only second", "neither",
                   "net discrimination (" + conf + " CI)", "conditional odds ratio", "p", "p adjusted"};
      for (const LevelPair& p : f.pairwise)
        t.rows.push_back({HeadCell(p.first_label + " vs " + p.second_label), Cell(FormatPercent(p.rate_first) + " vs " + FormatPercent(p.rate_second)),
                          NumCell(std::to_string(p.pairs.a)), NumCell(std::to_string(p.pairs.b)),
                          NumCell(std::to_string(p.pairs.c)), NumCell(std::to_string(p.pairs.d)),
                          NumCell(Fmt(p.net.among_positive.estimate) + " " + Ci(p.net.among_positive.ci)),
                          NumCell(Fmt(p.conditional_or.estimate) + " " + Ci(p.conditional_or.ci)),
                          NumCell(FormatP(p.p)), NumCell(FormatP(p.p_adjusted))});
    } else {
      t.caption = "Every pair of " + f.label + " levels: Fisher's exact test (two-sided; adjusted by " +
                  r.effects.correction + ")";
      t.headers = {"comparison", "rates", "difference", "p", "p adjusted"};
      for (const LevelPair& p : f.pairwise)
        t.rows.push_back({HeadCell(p.first_label + " vs " + p.second_label), Cell(FormatPercent(p.rate_first) + " vs " + FormatPercent(p.rate_second)),
                          NumCell(FormatPercent(p.difference)), NumCell(FormatP(p.p)), NumCell(FormatP(p.p_adjusted))});
    }
    o += RenderTable(t);
  }
  return o;
}

std::string TwoFactorTable(const AnalysisResult& r, const ReportContext&) {
  const TwoFactorModel& m = r.k_levels.model;
  if (!m.present) return "";
  std::string o = html::Heading("Two factors: conditional logistic regression");
  if (!m.failure.empty()) return o + html::Para("The model could not be fitted: " + m.failure + ".");
  for (const EffectTest& t : m.tests) o += html::Para(EffectTestSentence(t, r.alpha));
  HtmlTable t;
  t.caption = "Odds ratios (profile " + std::to_string(static_cast<int>(std::lround(r.confidence * 100))) +
              "% intervals): main effects from the model without interaction, interactions from the full model";
  t.headers = {"term", "odds ratio", "interval", "Wald p"};
  for (const ModelTerm& x : m.terms)
    t.rows.push_back({HeadCell(x.label), NumCell(Fmt(x.odds_ratio)), NumCell(Ci(x.ci)), NumCell(FormatP(x.p_wald))});
  return o + RenderTable(t);
}

std::string AdjustedTable(const AnalysisResult& r, const ReportContext&) {
  const AdjustedModel& m = r.adjusted;
  std::string o = html::Para(
      "The plan balances templates and send positions across the groups. This conditional logistic regression (one "
      "stratum per vacancy) estimates their effects as well, so the groups' odds ratios below are those with template "
      "and send position held fixed; compare them with the unadjusted conditional odds ratios above.");
  if (!m.failure.empty()) return o + html::Para("The model could not be fitted: " + m.failure + ".");
  for (const std::string& group : m.left_out)
    o += html::Para("Left out: " + group + ", which is confounded with the groups in these sets (it cannot be told apart from them).");
  HtmlTable t;
  t.caption = "Conditional logistic regression on group, template and send position (" +
              std::to_string(m.sets) + " informative sets; odds ratios against the reference group, the first template and send "
              "position 1; profile " +
              std::to_string(static_cast<int>(std::lround(r.confidence * 100))) + "% intervals)";
  t.headers = {"term", "odds ratio", "interval", "Wald p"};
  for (const AdjustedTerm& x : m.terms)
    t.rows.push_back({HeadCell(x.name), NumCell(Fmt(x.odds_ratio)), NumCell(Ci(x.ci)), NumCell(FormatP(x.p_wald))});
  o += RenderTable(t);
  if (m.nuisance_df > 0)
    o += html::Para("Template and send position together, likelihood-ratio test against the model with groups only: X^2 = " +
                    Fmt(m.nuisance_lr) + " on " + std::to_string(m.nuisance_df) + " df, " + PEquals(m.nuisance_p) + ".");
  return o;
}

std::string EmployerSetsTable(const AnalysisResult& r, const ReportContext& ctx) {
  const EmployerSetsSummary& e = r.employer_sets;
  std::string o = html::Para(
      std::to_string(e.employers) + " employers had at least one analysed set; " + std::to_string(e.employers_unequal) +
      " of them answered some applicants of a set positively and others not at least once. A single unequal set is weak "
      "evidence about a single employer. This table supports follow-up testing, not public naming.");
  HtmlTable t;
  t.caption = "Employers with more than one unequal set (positive answers per group)";
  t.headers = {"employer", "sets", "unequal sets"};
  for (const auto& a : r.arms) t.headers.push_back(ArmName(r, a.label));
  for (const EmployerSetRow& x : e.unequal_rows) {
    if (x.unequal < 2) break;  // sorted, most unequal first
    std::string who = x.pseudonym;
    if (ctx.reveal_employers) {
      auto it = ctx.employer_names.find(x.pseudonym);
      if (it != ctx.employer_names.end() && !it->second.empty()) who = it->second + " (" + x.pseudonym + ")";
    }
    std::vector<TableCell> row = {HeadCell(who), NumCell(std::to_string(x.sets)), NumCell(std::to_string(x.unequal))};
    for (int64_t p : x.positive) row.push_back(NumCell(std::to_string(p)));
    t.rows.push_back(row);
  }
  if (t.rows.empty()) return o + html::Para("No employer had more than one unequal set.");
  return o + RenderTable(t);
}

}  // namespace twinprobe
