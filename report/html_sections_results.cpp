// Summary, rates, paired and strata sections of the HTML report.
#include <cmath>

#include "report/fieldwork_state.h"
#include "report/html_escape.h"
#include "report/plural.h"
#include "report/html_parts.h"
#include "report/html_sections.h"
#include "report/early_stop_report.h"
#include "report/html_table.h"
#include "report/plain_summary.h"
#include "report/svg_bar_chart.h"
#include "report/svg_interval_chart.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string ConfPercent(double confidence) { return std::to_string(static_cast<int>(std::lround(confidence * 100))) + "%"; }

std::string IntervalText(double rate, const stats::Interval& ci) {
  return FormatPercent(rate) + " (" + FormatPercent(ci.low) + " to " + FormatPercent(ci.high) + ")";
}

std::string KeyFigure(const std::string& big, const std::string& label_html, const std::string& small) {
  return "<div class=\"keyfig\"><span class=\"big\">" + EscapeHtml(big) + "</span><span class=\"what\">" + label_html +
         "</span><span class=\"small\">" + EscapeHtml(small) + "</span></div>";
}

std::string CodesText(const std::vector<std::string>& codes) {
  std::string s;
  for (size_t i = 0; i < codes.size(); ++i)
    s += (i ? (i + 1 == codes.size() ? " or " : ", ") : "") + CodeName(codes[i]);
  return s;
}

}  // namespace

std::string SummaryKeyFigures(const AnalysisResult& r, const ReportContext&) {
  std::string o = html::Para(Headline(r), "headline") + "<div class=\"keyfigs\">";
  if (r.listings.listing_only) {
    for (const auto& g : r.listings.groups)
      o += KeyFigure(FormatPercent(g.exposure_share), "of the attention went to " + UserText(g.label) + " items",
                     std::to_string(g.appearances) + " places");
    return o + "</div>";
  }
  if (!EarlyStateSentence(r).empty()) return o + "</div>";  // the headline says what is missing: no 0.0% figures
  for (const auto& a : r.arms)
    o += KeyFigure(FormatPercent(a.rate), "positive answers to " + UserText(ArmName(r, a.label)) + " applicants",
                   std::to_string(a.positive) + " of " + std::to_string(a.probes) + " applications");
  if (r.has_paired && r.paired.discordant() > 0) {
    o += KeyFigure(std::to_string(r.paired.b) + " : " + std::to_string(r.paired.c),
                   "unequal pairs favouring " + UserText(ArmName(r, r.reference_label)) + " : " +
                       UserText(ArmName(r, r.other_label)),
                   std::to_string(r.paired.discordant()) + " of " + Count(r.paired.n(), "pair", "pairs"));
    if (!r.effects.comparisons.empty() && r.effects.comparisons.front().paired &&
        !std::isnan(r.effects.comparisons.front().net.among_positive.estimate)) {
      const auto& net = r.effects.comparisons.front().net.among_positive;
      o += KeyFigure(FormatPercent(net.estimate), "net discrimination: " + UserText(ArmName(r, r.reference_label)) + " over " + UserText(ArmName(r, r.other_label)),
                     ConfPercent(r.confidence) + " interval " + FormatPercent(net.ci.low) + " to " +
                         FormatPercent(net.ci.high));
    }
    o += KeyFigure(PlainP(r.mcnemar_exact_p), "chance of a split this uneven if employers had no preference",
                   "exact McNemar test, two-sided: " + PEquals(r.mcnemar_exact_p));
  }
  return o + "</div>";
}

std::string SummaryParagraphs(const AnalysisResult& r, const ReportContext&) {
  std::string o = "<div class=\"plain\">";
  for (const auto& p : PlainSummary(r)) o += html::Heading(p.heading) + html::Para(p.text);
  return o + "</div>";
}

std::string RatesChart(const AnalysisResult& r, const ReportContext&) {
  if (r.arms.empty() || r.sets_analysed == 0)
    return html::Absent("No complete set has been analysed yet, so there are no callback rates to show.");
  svg::IntervalChart chart;
  chart.id = "chart-rates";
  const std::string rate = r.records ? "Positive-outcome rate" : "Positive-callback rate";
  chart.title = rate + " by group, with " + ConfPercent(r.confidence) + " confidence intervals";
  chart.axis_label = "share of applications answered positively";
  chart.percent = true;
  std::string desc = "Dot-and-interval chart.";
  HtmlTable t;
  t.caption = r.records ? "Positive outcomes by group" : "Positive callbacks by group";
  t.headers = {"Group", "Positive / applications", "Rate", ConfPercent(r.confidence) + " interval"};
  for (const auto& a : r.arms) {
    const std::string text = IntervalText(a.rate, a.ci);
    chart.rows.push_back({ArmName(r, a.label), a.rate, a.ci.low, a.ci.high, text});
    desc += " " + ArmName(r, a.label) + ": " + std::to_string(a.positive) + " of " + std::to_string(a.probes) + ", " + text +
            ".";
    t.rows.push_back({HeadCell(ArmName(r, a.label) + (a.is_reference ? " (reference)" : "")),
                      NumCell(std::to_string(a.positive) + " / " + std::to_string(a.probes)),
                      NumCell(FormatPercent(a.rate)),
                      NumCell(FormatPercent(a.ci.low) + " to " + FormatPercent(a.ci.high))});
  }
  chart.description = desc;
  return html::Para("Each dot is the share of a group's applications that received a positive answer (" +
                    CodesText(r.positive_codes) +
                    "); the bar around it is the exact " + ConfPercent(r.confidence) +
                    " confidence interval (Clopper–Pearson), the range of true rates the data are compatible with.") +
         html::Figure("fig-rates",
                      rate + " by group. Bars: exact " + ConfPercent(r.confidence) +
                          " confidence intervals.",
                      svg::RenderIntervalChart(chart), RenderTable(t));
}

std::string PairedTable(const AnalysisResult& r, const ReportContext&) {
  const auto& p = r.paired;
  const std::string ref = UserText(ArmName(r, r.reference_label)), other = UserText(ArmName(r, r.other_label));
  std::string cross =
      "<table class=\"data cross\"><caption>The " + std::to_string(p.n()) +
      " analysed pairs by outcome</caption><thead><tr><td></td><th scope=\"col\">" + other +
      " answered positively</th><th scope=\"col\">" + other + " not</th></tr></thead><tbody><tr><th scope=\"row\">" +
      ref + " answered positively</th><td class=\"num\">" + std::to_string(p.a) + " <small>(a, both)</small></td>" +
      "<td class=\"num hl\">" + std::to_string(p.b) + " <small>(b, only " + ref + ")</small></td></tr>" +
      "<tr><th scope=\"row\">" + ref + " not</th><td class=\"num hl\">" + std::to_string(p.c) + " <small>(c, only " +
      other + ")</small></td><td class=\"num\">" + std::to_string(p.d) + " <small>(d, neither)</small></td></tr></tbody></table>";

  svg::BarChart chart;
  chart.id = "chart-discordant";
  chart.title = "Pairs in which the employer treated the two applicants differently";
  chart.axis_label = "pairs";
  chart.colour_by_group = true;
  chart.groups = {{"only " + ArmName(r, r.reference_label) + " answered", {static_cast<double>(p.b)}, {std::to_string(p.b)}},
                  {"only " + ArmName(r, r.other_label) + " answered", {static_cast<double>(p.c)}, {std::to_string(p.c)}}};
  chart.description = "Bar chart of the " + std::to_string(p.discordant()) + " unequal pairs: only " +
                      ArmName(r, r.reference_label) + " answered positively in " + std::to_string(p.b) + ", only " +
                      ArmName(r, r.other_label) + " in " + std::to_string(p.c) + ".";
  return html::Para(
             "Each vacancy received one application from each group, so every vacancy is a pair. Pairs in which both "
             "or neither applicant was answered positively say nothing about a preference; the evidence lies in the "
             "unequal pairs (b and c).") +
         html::Figure("fig-paired", "The unequal pairs: which applicant alone received a positive answer.",
                      svg::RenderBarChart(chart), cross);
}

std::string PairedTest(const AnalysisResult& r, const ReportContext&) {
  const auto& p = r.paired;
  std::string o = html::Heading("Exact McNemar test");
  if (p.discordant() == 0)
    return o + html::Para("No pair was unequal (b = c = 0), so the test has nothing to weigh: p = 1.");
  o += html::Para("Under the hypothesis that employers have no preference, each of the " +
                  std::to_string(p.discordant()) + " unequal pairs is equally likely to favour either applicant, so b " +
                  "follows a binomial distribution with " + std::to_string(p.discordant()) +
                  " trials and probability ½. The exact two-sided p-value for b = " + std::to_string(p.b) + " and c = " +
                  std::to_string(p.c) + " is " + FormatP(r.mcnemar_exact_p) + ".");
  std::string verdict = r.mcnemar_exact_p < r.alpha
                            ? "At the study's significance level (alpha = " + FormatP(r.alpha) +
                                  ") the exact McNemar test, two-sided, rejects equal treatment: " +
                                  PEquals(r.mcnemar_exact_p) + "."
                            : "At the study's significance level (alpha = " + FormatP(r.alpha) +
                                  ") the exact McNemar test, two-sided, does not reject equal treatment (" +
                                  PEquals(r.mcnemar_exact_p) + "); this is not evidence that there is none.";
  return o + html::Para(verdict, "verdict") + RenderEarlyStopHtml(r.early_stop, r.reference_label, r.other_label);
}

std::string StrataTables(const AnalysisResult& r, const ReportContext&) {
  if (!r.has_paired || r.strata.empty()) return "";
  const std::string ref = ArmName(r, r.reference_label), other = ArmName(r, r.other_label);
  std::string o = html::Heading("Unequal pairs by stratum") + html::Para(
      "The same pairs, split by the vacancy's strata. The chart shows, within each stratum, how many unequal pairs "
      "favoured each applicant; the tables count every pair. Small strata give wide uncertainty; differences between "
      "strata are a reason for a closer look, not findings on their own.");
  svg::BarChart chart;
  chart.id = "chart-strata";
  chart.title = "Unequal pairs within each stratum";
  chart.axis_label = "unequal pairs";
  chart.series_labels = {"only " + ref + " answered", "only " + other + " answered"};
  std::string desc = "Grouped bar chart of unequal pairs by stratum.";
  std::string tables;
  std::string current;
  HtmlTable t;
  auto flush = [&] {
    if (!t.rows.empty()) tables += RenderTable(t);
    t = HtmlTable{};
  };
  for (const auto& s : r.strata) {
    if (s.name != current) {
      flush();
      current = s.name;
      t.caption = "Pairs by " + s.name;
      t.headers = {s.name, "pairs", "both (a)", "only " + ref + " (b)", "only " + other + " (c)", "neither (d)"};
    }
    t.rows.push_back({HeadCell(s.value), NumCell(std::to_string(s.table.n())), NumCell(std::to_string(s.table.a)),
                      NumCell(std::to_string(s.table.b)), NumCell(std::to_string(s.table.c)),
                      NumCell(std::to_string(s.table.d))});
    chart.groups.push_back({s.name + ": " + s.value,
                            {static_cast<double>(s.table.b), static_cast<double>(s.table.c)},
                            {std::to_string(s.table.b), std::to_string(s.table.c)}});
    desc += " " + s.name + " " + s.value + ": only " + ref + " " + std::to_string(s.table.b) + ", only " + other + " " +
            std::to_string(s.table.c) + ".";
  }
  flush();
  chart.description = desc;
  return o + html::Figure("fig-strata", "Unequal pairs within each stratum: bars compare the two kinds of unequal "
                                        "treatment; the tables give every cell.",
                          svg::RenderBarChart(chart), "<div class=\"tables\">" + tables + "</div>");
}

}  // namespace twinprobe
