// The listing audit (analysis/listing_analysis.h) in the HTML report: how
// groups are placed in ranked lists. Tables and bars only render what the
// audit holds (docs/ranks.md explains every figure).
#include <algorithm>
#include <cmath>
#include <cstdio>

#include "analysis/strongest_evidence.h"
#include "report/html_escape.h"
#include "report/html_parts.h"
#include "report/html_sections.h"
#include "report/html_table.h"
#include "report/svg_bar_chart.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Fixed(double v, int digits) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.*f", digits, v);
  return buf;
}

std::string Signed(double v, int digits) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%+.*f", digits, v);
  return buf;
}

std::string StratumName(const ListingComparison& c) {
  if (c.query.empty()) return c.location;
  return c.location.empty() ? c.query : c.query + " / " + c.location;
}

}  // namespace

std::string ListingOverview(const AnalysisResult& r, const ReportContext&) {
  const ListingAudit& a = r.listings;
  std::string factors;
  for (const auto& f : a.factors) factors += (factors.empty() ? "" : ", ") + f;
  std::string o = html::Para(
      std::to_string(a.listings) + " ranked lists in " + std::to_string(a.strata) + " query \u00D7 location strata: " +
      std::to_string(a.appearances) + " places, " + std::to_string(a.labelled_appearances) +
      " of them held by items labelled with every factor (" + factors + ").");
  if (a.factors.empty())
    return o + html::Absent("No item carries a group label, so nothing can be compared; import labels with the lists.");
  o += html::Para("Exposure is the attention a place gets (" +
                  (a.discount == "log2" ? std::string("1 / log2(1 + position)") : a.discount) + ", the " + a.discount +
                  " discount): a group's exposure share is its part of all the attention in the lists; top " +
                  std::to_string(a.top_k) + " is its share of places 1 to " + std::to_string(a.top_k) + ".");
  svg::BarChart chart;
  chart.id = "chart-listing-groups";
  chart.title = "Share of exposure and of the top " + std::to_string(a.top_k) + " places, by group";
  chart.axis_label = "share";
  chart.percent = true;
  chart.series_labels = {"exposure share", "top " + std::to_string(a.top_k) + " share"};
  HtmlTable t;
  t.caption = "Groups in the ranked lists";
  t.headers = {"group", "places", "exposure", "exposure share", "top " + std::to_string(a.top_k), "mean position",
               "median position"};
  std::string desc = "Grouped bar chart.";
  for (const auto& g : a.groups) {
    chart.groups.push_back({g.label,
                            {g.exposure_share, g.top_k_share},
                            {FormatPercent(g.exposure_share), FormatPercent(g.top_k_share)}});
    desc += " " + g.label + ": exposure share " + FormatPercent(g.exposure_share) + ", top " + std::to_string(a.top_k) +
            " share " + FormatPercent(g.top_k_share) + ".";
    t.rows.push_back({HeadCell(g.label), NumCell(std::to_string(g.appearances)), NumCell(Fixed(g.exposure, 4)),
                      NumCell(FormatPercent(g.exposure_share)), NumCell(FormatPercent(g.top_k_share)),
                      NumCell(Fixed(g.mean_position, 2)), NumCell(Fixed(g.median_position, 1))});
  }
  chart.description = desc;
  return o + html::Figure("fig-listing-groups", "How much of the lists' attention each group received.",
                          svg::RenderBarChart(chart), RenderTable(t));
}

std::string ListingComparisons(const AnalysisResult& r, const ReportContext&) {
  const ListingAudit& a = r.listings;
  if (a.overall.empty()) return "";
  HtmlTable t;
  t.caption = "Reference level against each other level, over all lists";
  t.headers = {"factor", "comparison", "places", "exposure gap", "p (permutation, two-sided)",
               "earth mover's distance", "p (permutation, larger distance)", "Mann\u2013Whitney p (descriptive)"};
  for (const auto& c : a.overall)
    t.rows.push_back({HeadCell(c.factor), Cell(c.reference + " vs " + c.other),
                      NumCell(std::to_string(c.n_reference) + " / " + std::to_string(c.n_other)),
                      NumCell(Signed(c.exposure_gap, 4)), NumCell(FormatP(c.gap_p)), NumCell(Fixed(c.emd, 2) + " places"),
                      NumCell(FormatP(c.emd_p)), NumCell(FormatP(c.mann_whitney_p))});
  std::string o = html::Heading("Comparisons") +
                  html::Para("The exposure gap is the reference level's exposure minus the other level's; the earth "
                             "mover's distance is how many places, on average, one group's positions must move to "
                             "match the other's. Permutation tests exchange the groups of items within each query "
                             "\u00D7 location (" + std::to_string(a.resamples) + " resamples, seed " +
                             std::to_string(a.seed) + "), so repeated lists of one query are not counted as "
                             "independent evidence.") +
                  RenderTable(t);
  if (!a.paired.empty()) {
    HtmlTable p;
    p.caption = "Across strata: the sign of the exposure gap in each query \u00D7 location";
    p.headers = {"factor", "comparison", "strata", "favour reference", "favour other", "sign test p",
                 "Wilcoxon signed-rank V", "p"};
    for (const auto& x : a.paired)
      p.rows.push_back({HeadCell(x.factor), Cell(x.reference + " vs " + x.other), NumCell(std::to_string(x.strata)),
                        NumCell(std::to_string(x.sign.positive)), NumCell(std::to_string(x.sign.negative)),
                        NumCell(FormatP(x.sign.p_value)), NumCell(Fixed(x.wilcoxon.statistic, 0)),
                        NumCell(FormatP(x.wilcoxon.p_value))});
    o += RenderTable(p);
  }
  return o;
}

std::string ListingStrata(const AnalysisResult& r, const ReportContext&) {
  const ListingAudit& a = r.listings;
  if (a.by_stratum.empty()) return "";
  const bool adjusted = a.by_stratum.front().gap_p_adjusted.has_value();
  const std::vector<const ListingComparison*> rows = StrongestEvidence(a);  // ties in adjusted p by raw p
  auto key = [&](const ListingComparison* c) { return adjusted ? *c->gap_p_adjusted : c->gap_p; };
  int64_t below = 0;
  for (auto* c : rows) below += key(c) < r.alpha;
  HtmlTable t;
  t.caption = "Query \u00D7 location strata with the strongest evidence of an exposure gap (up to 8)";
  t.headers = {"stratum", "comparison", "exposure gap", "p", adjusted ? "p adjusted (" + a.correction + ")" : "",
               "earth mover's distance"};
  for (size_t i = 0; i < rows.size() && i < 8; ++i) {
    const auto& c = *rows[i];
    t.rows.push_back({HeadCell(StratumName(c)), Cell(c.reference + " vs " + c.other), NumCell(Signed(c.exposure_gap, 4)),
                      NumCell(FormatP(c.gap_p)), NumCell(adjusted ? FormatP(*c.gap_p_adjusted) : ""),
                      NumCell(Fixed(c.emd, 2))});
  }
  return html::Heading("By query and location") + RenderTable(t) +
         html::Para(std::to_string(below) + " of " + std::to_string(rows.size()) + " stratum comparisons have " +
                        (adjusted ? "an adjusted p" : "a p (not adjusted: unknown correction '" + a.correction + "')") +
                        " below alpha = " + FormatP(r.alpha) + ".",
                    "note");
}

std::string ListingStructure(const AnalysisResult& r, const ReportContext&) {
  const ListingAudit& a = r.listings;
  std::string o;
  if (!a.disparity.empty()) {
    HtmlTable t;
    t.caption = "Neighbour groups: mean earth mover's distance (places) to the groups one level away";
    t.headers = {"dimension", "most disparate", "least disparate"};
    auto list = [](const std::vector<DisparityEntry>& v) {
      std::string s;
      for (const auto& e : v) s += (s.empty() ? "" : "; ") + e.value + " " + Fixed(e.disparity, 2);
      return s;
    };
    for (const auto& d : a.disparity) t.rows.push_back({HeadCell(d.dimension), Cell(list(d.most)), Cell(list(d.least))});
    o += RenderTable(t);
  }
  if (a.widest) {
    const auto& w = *a.widest;
    o += html::Para("Widest split of the listed population: " + w.description + " (" + std::to_string(w.parts) +
                    " parts), mean distance between parts " + Fixed(w.distance, 2) + " places; permutation p = " +
                    FormatP(w.p_value) + " for the largest of " + std::to_string(w.candidates) + " candidate splits (" +
                    (w.exhaustive ? "exhaustive search" : "bounded search") + ").");
  }
  if (!a.overlap.empty()) {
    HtmlTable t;
    t.caption = "Personalised lists: mean Jaccard distance between the items shown to two profiles";
    t.headers = {"profile", "profile", "pairs of lists", "mean Jaccard distance"};
    for (const auto& p : a.overlap)
      t.rows.push_back({Cell(p.profile_a), Cell(p.profile_b), NumCell(std::to_string(p.comparisons)),
                        NumCell(Fixed(p.mean_jaccard_distance, 3))});
    o += RenderTable(t) + html::Para("Pairs of lists seen by the same profile are the noise floor.", "note");
  }
  return o.empty() ? "" : html::Heading("Structure") + o;
}

}  // namespace twinprobe
