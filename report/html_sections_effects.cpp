// The effect estimates of analysis/effects.h in the HTML report: effect
// measures beside the paired table, every arm against the reference, the
// forest chart of odds ratios per stratum (adjusted p) and the summary
// across strata (pairs kept for paired and sets designs; Mantel–Haenszel /
// Breslow–Day for unpaired designs only).
#include <cmath>
#include <cstdio>

#include "report/effects_report.h"
#include "report/fieldwork_state.h"
#include "report/html_escape.h"
#include "report/html_parts.h"
#include "report/html_sections.h"
#include "report/html_table.h"
#include "report/plain_summary.h"
#include "report/svg_forest_chart.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Conf(double confidence) { return std::to_string(static_cast<int>(std::lround(confidence * 100))) + "%"; }

std::string PercentInterval(const stats::Estimate& e) {
  if (std::isnan(e.estimate)) return "not estimable";
  return FormatPercent(e.estimate) + " (" + FormatPercent(e.ci.low) + " to " + FormatPercent(e.ci.high) + ")";
}

const ArmComparison* FirstComparison(const AnalysisResult& r) {
  return r.effects.comparisons.empty() ? nullptr : &r.effects.comparisons.front();
}

// The odds ratio a comparison reports: conditional b/c for paired data, the
// conditional MLE of Fisher's test for unpaired data.
svg::ForestRow Row(const std::string& label, const ArmComparison& c, double p) {
  if (c.paired) return {label, c.conditional_or.estimate, c.conditional_or.ci.low, c.conditional_or.ci.high, p, false};
  return {label, c.fisher.estimate, c.fisher.ci.low, c.fisher.ci.high, p, false};
}

std::string OrHeader(const ArmComparison& c) {
  return c.paired ? "conditional odds ratio b/c" : "odds ratio (conditional MLE)";
}

}  // namespace

std::string PairedEffects(const AnalysisResult& r, const ReportContext&) {
  const ArmComparison* c = FirstComparison(r);
  if (!c || !c->paired) return "";
  const std::string ref = ArmName(r, r.reference_label), other = ArmName(r, c->other_label), conf = Conf(r.confidence);
  HtmlTable t;
  t.caption = "Effect measures (" + ref + " against " + other + ")";
  t.headers = {"measure", "estimate (" + conf + " interval, two-sided)", "what it means"};
  t.rows.push_back({HeadCell("callback-rate ratio (a + b) / (a + c)"),
                    NumCell(svg::FormatRatioInterval(c->callback_ratio.estimate, c->callback_ratio.ci.low,
                                                     c->callback_ratio.ci.high)),
                    Cell("the " + ref + " callback rate divided by the " + other +
                         " callback rate (Bonett\u2013Price paired interval)")});
  t.rows.push_back({HeadCell("net discrimination (b \u2212 c) / (a + b + c)"), NumCell(PercentInterval(c->net.among_positive)),
                    Cell("among vacancies where at least one applicant was answered positively, the share favouring " +
                         ref + " minus the share favouring " + other + " (ILO measure; Newcombe interval)")});
  t.rows.push_back({HeadCell("difference of rates (b \u2212 c) / n"), NumCell(PercentInterval(c->net.over_all)),
                    Cell("the " + ref + " rate minus the " + other + " rate, over all pairs (Newcombe interval)")});
  t.rows.push_back({HeadCell("conditional odds ratio b / c"),
                    NumCell(svg::FormatRatioInterval(c->conditional_or.estimate, c->conditional_or.ci.low,
                                                     c->conditional_or.ci.high)),
                    Cell("how many times more often an unequal pair favoured " + ref + " than " + other +
                         " (exact Clopper\u2013Pearson interval)")});
  t.rows.push_back({HeadCell("conditional odds ratio b / c, mid-p interval"),
                    NumCell(svg::FormatRatioInterval(c->conditional_or_mid_p.estimate, c->conditional_or_mid_p.ci.low,
                                                     c->conditional_or_mid_p.ci.high)),
                    Cell("the same estimate with the mid-p interval; less conservative than the exact one")});
  t.rows.push_back({HeadCell("exact McNemar test, two-sided"), NumCell(PEquals(c->mcnemar.exact)),
                    Cell(std::string(c->mcnemar.exact.p < r.alpha ? "rejects" : "does not reject") +
                         " equal treatment at alpha " + FormatP(r.alpha) +
                         ": the chance of a split at least this uneven if employers had no preference")});
  t.rows.push_back({HeadCell("mid-p McNemar, two-sided"), NumCell(FormatP(c->mcnemar.mid_p)),
                    Cell("the exact p less half the probability of the observed split; less conservative")});
  if (c->equivalence) {
    const auto& q = *c->equivalence;
    t.rows.push_back({HeadCell("equivalence test, margin \u00B1" + FormatPercent(q.upper_margin)),
                      NumCell(PEquals(q.p)),
                      Cell(EquivalenceSentence(q))});
  }
  char chi[96];
  std::snprintf(chi, sizeof chi, "X\u00B2 = %.3g, %s", c->mcnemar.chi2_corrected,
                PEquals(c->mcnemar.chi2_corrected_p).c_str());
  t.rows.push_back({HeadCell("asymptotic McNemar, two-sided (continuity corrected)"), NumCell(chi),
                    Cell("the large-sample version, as R's mcnemar.test")});
  return html::Heading("Effect measures") + RenderTable(t);
}

std::string ComparisonsForest(const AnalysisResult& r, const ReportContext&) {
  const Effects& e = r.effects;
  if (e.comparisons.empty()) return "";
  const std::string ref = r.arms.empty() ? "reference" : ArmName(r, r.arms.front().label);
  svg::ForestChart chart;
  chart.id = "chart-comparisons";
  chart.title = "Each group against " + ref + ": odds ratios with " + Conf(r.confidence) + " intervals";
  chart.left_note = "favours the other group";
  chart.right_note = "favours " + ref;
  chart.p_header = "p (" + e.correction + ")";
  HtmlTable t;
  t.caption = "Each group against " + ref;
  t.headers = {"group", OrHeader(e.comparisons.front()) + " (" + Conf(r.confidence) + " interval)", "p",
               "p adjusted (" + e.correction + ")"};
  std::string desc = "Forest chart on a log scale.";
  for (const auto& c : e.comparisons) {
    svg::ForestRow row = Row(ArmName(r, c.other_label), c, c.p_adjusted);
    const std::string text = svg::FormatRatioInterval(row.estimate, row.low, row.high);
    desc += " " + row.label + ": " + text + ", adjusted p " + FormatP(c.p_adjusted) + ".";
    chart.rows.push_back(row);
    t.rows.push_back({HeadCell(row.label), NumCell(text), NumCell(FormatP(c.p)), NumCell(FormatP(c.p_adjusted))});
  }
  chart.description = desc;
  return html::Para("Each row compares one group with the reference group " + ref +
                    ". An odds ratio above 1 means the reference group was answered positively more often; the "
                    "p-values are adjusted for the number of comparisons (" + e.correction + ").") +
         html::Figure("fig-comparisons", "Odds ratios of each group against " + ref + " (log scale).",
                      svg::RenderForestChart(chart), RenderTable(t), true);
}

std::string StrataForest(const AnalysisResult& r, const ReportContext&) {
  const Effects& e = r.effects;
  if (e.strata.empty()) return "";
  const std::string ref = r.arms.empty() ? "reference" : ArmName(r, r.arms.front().label);
  std::string o;
  for (const auto& overall : e.comparisons) {
    const std::string other = ArmName(r, overall.other_label);
    svg::ForestChart chart;
    chart.id = "chart-forest-" + std::to_string(&overall - &e.comparisons.front());
    chart.title = "Odds ratio within each stratum, " + ref + " against " + other;
    chart.left_note = "favours " + other;
    chart.right_note = "favours " + ref;
    chart.p_header = "p (" + e.correction + ")";
    HtmlTable t;
    t.caption = "Within each stratum, " + ref + " against " + other;
    t.headers = overall.paired
                    ? std::vector<std::string>{"stratum", "b", "c", OrHeader(overall), "p", "p adjusted"}
                    : std::vector<std::string>{"stratum", ref + " positive", other + " positive", OrHeader(overall), "p",
                                               "p adjusted"};
    std::string desc = "Forest chart on a log scale, one row per stratum value.";
    for (const auto& s : e.strata) {
      if (s.result.other_label != overall.other_label) continue;
      svg::ForestRow row = Row(s.column + ": " + s.value, s.result, s.result.p_adjusted);
      const std::string text = svg::FormatRatioInterval(row.estimate, row.low, row.high);
      desc += " " + row.label + ": " + text + ", adjusted p " + FormatP(s.result.p_adjusted) + ".";
      chart.rows.push_back(row);
      const auto& c = s.result;
      if (c.paired)
        t.rows.push_back({HeadCell(row.label), NumCell(std::to_string(c.pairs.b)), NumCell(std::to_string(c.pairs.c)),
                          NumCell(text), NumCell(FormatP(c.p)), NumCell(FormatP(c.p_adjusted))});
      else
        t.rows.push_back({HeadCell(row.label),
                          NumCell(std::to_string(c.table.a) + " / " + std::to_string(c.table.a + c.table.b)),
                          NumCell(std::to_string(c.table.c) + " / " + std::to_string(c.table.c + c.table.d)),
                          NumCell(text), NumCell(FormatP(c.p)), NumCell(FormatP(c.p_adjusted))});
    }
    // The summary on the same scale: for pairs the overall conditional odds
    // ratio (Mantel–Haenszel over vacancies reduces to it); for unpaired
    // data the Mantel–Haenszel odds ratio of the first stratum column.
    if (overall.paired) {
      svg::ForestRow all = Row("all pairs", overall, overall.p_adjusted);
      all.summary = true;
      desc += " All pairs: " + svg::FormatRatioInterval(all.estimate, all.low, all.high) + ".";
      chart.rows.push_back(all);
    } else {
      for (const auto& a : e.across)
        if (a.other_label == overall.other_label) {
          chart.rows.push_back({"Mantel\u2013Haenszel over " + a.column, a.mh.estimate, a.mh.ci.low, a.mh.ci.high,
                                a.mh.chi2_corrected_p.p, true});
          desc += " Mantel-Haenszel over " + a.column + ": " +
                  svg::FormatRatioInterval(a.mh.estimate, a.mh.ci.low, a.mh.ci.high) + ".";
          break;
        }
    }
    chart.description = desc;
    o += html::Figure("fig-forest-" + std::to_string(&overall - &e.comparisons.front()),
                      "Odds ratios within each stratum (log scale; arrows: an interval reaching 0 or infinity). "
                      "p-values adjusted with " + e.correction + " within each stratum column.",
                      svg::RenderForestChart(chart), RenderTable(t), true);
  }
  return html::Heading("Odds ratios by stratum") +
         html::Para(std::string("Each row is the odds ratio within one stratum value, with its exact ") +
                    Conf(r.confidence) + " interval; above 1, " + ref +
                    " applicants were favoured. Strata with few unequal pairs have wide intervals; an interval "
                    "that reaches 0 or infinity (no unequal pair one way) ends in an arrow. The p-values of one "
                    "stratum column are adjusted together (" + e.correction + ").") +
         o;
}

namespace {

// Pair-keeping rows (paired and sets designs): the pooled conditional odds
// ratio and the homogeneity test of the discordant split per column.
std::string AcrossPairedTable(const AnalysisResult& r, const std::string& ref) {
  HtmlTable t;
  t.caption = "Across strata, pairs kept (discordant sets per stratum value)";
  t.headers = {"stratum column", "against", "values", "pooled conditional odds ratio \u03A3b/\u03A3c (" +
                   Conf(r.confidence) + ", exact, two-sided)",
               "homogeneity of b/(b+c): Pearson chi-square", "exact (Freeman\u2013Halton)"};
  for (const auto& a : r.effects.across) {
    if (!a.paired) continue;
    const auto& h = a.homogeneity;
    std::string chi = "not testable", exact = "\u2013";
    if (h.strata_used >= 2) {
      char buf[128];
      std::snprintf(buf, sizeof buf, "X\u00B2 = %.3g on %d df, %s", h.chi2, h.df, PEquals(h.chi2_p).c_str());
      chi = buf;
      if (h.exact_p) exact = PEquals(*h.exact_p);
    }
    t.rows.push_back({HeadCell(a.column), Cell(ArmName(r, a.other_label)), NumCell(std::to_string(a.values)),
                      NumCell(std::to_string(h.total_b) + "/" + std::to_string(h.total_c) + " = " +
                              svg::FormatRatioInterval(h.pooled_odds_ratio.estimate, h.pooled_odds_ratio.ci.low,
                                                       h.pooled_odds_ratio.ci.high)),
                      NumCell(chi), NumCell(exact)});
  }
  const std::string note =
      "Within each stratum value only the sets where the employer treated the applicants differently carry "
      "information: b sets favoured " + ref + " applicants, c sets the other group. The pooled conditional odds "
      "ratio \u03A3b/\u03A3c keeps the pairs. The homogeneity test asks whether the split b/(b+c) differs "
      "between stratum values (Pearson\u2019s chi-square test on the k \u00D7 2 table of (b, c); read the exact "
      "Freeman\u2013Halton p when expected counts are small). Mantel\u2013Haenszel, CMH and Breslow\u2013Day are "
      "not used here: they would count the two applications of a set as independent.";
  return html::Heading("Across strata") + html::Para(note) + RenderTable(t);
}

}  // namespace

std::string AcrossStrataTable(const AnalysisResult& r, const ReportContext&) {
  const Effects& e = r.effects;
  if (e.across.empty()) return "";
  const std::string ref = r.arms.empty() ? "reference" : ArmName(r, r.arms.front().label);
  if (e.across.front().paired) return AcrossPairedTable(r, ref);
  HtmlTable t;
  t.caption = "Across strata (group \u00D7 outcome tables)";
  t.headers = {"stratum column", "against", "values", "Mantel\u2013Haenszel odds ratio (" + Conf(r.confidence) + ", two-sided)",
               "CMH test, two-sided (corrected)", "Breslow\u2013Day (Tarone)"};
  for (const auto& a : e.across) {
    char cmh[96], bd[128];
    std::snprintf(cmh, sizeof cmh, "X\u00B2 = %.3g, %s", a.mh.chi2_corrected, PEquals(a.mh.chi2_corrected_p).c_str());
    std::snprintf(bd, sizeof bd, "X\u00B2 = %.3g on %.0f df, %s (%s)", a.breslow_day.statistic, a.breslow_day.df,
                  PEquals(a.breslow_day.p).c_str(), FormatP(a.breslow_day.tarone_p).c_str());
    t.rows.push_back({HeadCell(a.column), Cell(ArmName(r, a.other_label)), NumCell(std::to_string(a.values)),
                      NumCell(svg::FormatRatioInterval(a.mh.estimate, a.mh.ci.low, a.mh.ci.high)), NumCell(cmh),
                      NumCell(bd)});
  }
  const std::string note =
      "The Mantel\u2013Haenszel odds ratio pools the group \u00D7 outcome tables of the stratum values; the CMH test "
      "(two-sided) asks whether " + ref + " applicants were favoured after allowing for the stratum, and "
      "Breslow\u2013Day whether the odds ratio differs between stratum values.";
  return html::Heading("Across strata") + html::Para(note) + RenderTable(t);
}

// A column with one value among the analysed sets: one sentence in place of
// a one-row stratified table.
std::string SingleStrataNote(const AnalysisResult& r, const ReportContext&) {
  std::string o;
  for (const std::string& sentence : SingleStratumSentences(r)) o += html::Para(sentence);
  return o;
}

}  // namespace twinprobe
