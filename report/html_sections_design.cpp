// The design section of the HTML report: factors and arms, counts, strata,
// and the design's integrity (hash, seed, freeze and deviations). New design
// fields (balance tables, deviations …) each get one part function here and
// one entry in HtmlSections().
#include <cstdio>

#include "report/html_escape.h"
#include "report/html_parts.h"
#include "report/html_sections.h"
#include "report/html_table.h"
#include "report/plain_summary.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Joined(const std::vector<std::string>& items) {
  std::string s;
  for (const auto& x : items) s += (s.empty() ? "" : ", ") + x;
  return s;
}

std::string Plain(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%g", v);
  return buf;
}

}  // namespace

std::string DesignFactors(const AnalysisResult& r, const ReportContext&) {
  const auto& d = r.design;
  // How each factor showed in the applications, from the design the plan
  // stored (a name pool keyed by it, template fields it sets).
  std::string signal;
  if (d.factors.size() == 1 && !d.factors.front().signal.empty()) {
    signal = "signalled by " + d.factors.front().signal;
  } else {
    for (const auto& x : d.factors)
      if (!x.signal.empty()) signal += (signal.empty() ? "signalled by " : "; ") + x.signal + " (" + x.name + ")";
  }
  if (signal.empty()) signal = "signalled by the applicant's name and contact details";
  std::string o = html::Para(
      "A factor is the protected attribute under test; its levels are the groups compared. The applications in a set "
      "differed only in the factor's level, " + signal + "." +
      std::string(r.plan_origin == "plan" && d.templates.size() > 1
                       ? " The CV templates were rotated so that each group used each template equally often."
                       : ""));
  o += "<div class=\"tables\">";
  if (!d.factors.empty()) {
    HtmlTable f;
    f.caption = "Factors";
    f.headers = {"Factor", "Levels", "Reference level"};
    for (const auto& x : d.factors) {
      // A level with a display label reads "28 (aged 28)"; a factor varied
      // between vacancies says so after its name.
      std::vector<std::string> levels;
      for (size_t i = 0; i < x.levels.size(); ++i)
        levels.push_back(i < x.level_labels.size() && !x.level_labels[i].empty()
                             ? x.levels[i] + " (" + x.level_labels[i] + ")"
                             : x.levels[i]);
      const std::string name = (x.label.empty() ? x.name : x.label + " (" + x.name + ")") +
                               (x.between ? ", between vacancies" : "");
      f.rows.push_back({HeadCell(name), Cell(Joined(levels)), Cell(x.reference)});
    }
    o += RenderTable(f);
  }
  if (!d.arms.empty()) {
    HtmlTable a;
    a.caption = "Groups (arms)";
    a.headers = {"Group", "Stored label", "Fictitious applicants", "Applications planned"};
    for (const auto& x : d.arms)
      a.rows.push_back({HeadCell(ArmName(x.label) + (x.is_reference ? " (reference)" : "")), Cell(x.label),
                        NumCell(std::to_string(x.profiles)), NumCell(std::to_string(x.probes_planned))});
    o += RenderTable(a);
  }
  return o + "</div>";
}

std::string DesignCounts(const AnalysisResult& r, const ReportContext&) {
  const auto& d = r.design;
  std::vector<std::pair<std::string, std::string>> rows = {
      {"Design", r.kind + (r.plan_origin == "import" ? " (imported data)" : "")},
      {"Vacancies", std::to_string(r.vacancies)},
      {"Employers", std::to_string(d.employers) + " (kept under keyed pseudonyms)"},
      {"Applications planned", std::to_string(r.probes_planned)},
      {"Applications sent", std::to_string(r.probes_sent)},
      {"Responses recorded", std::to_string(r.responses) +
                                 (r.responses_superseded
                                      ? " (" + std::to_string(r.responses_superseded) + " earlier entries corrected; both kept)"
                                      : "")},
      {"Complete sets analysed", std::to_string(r.sets_analysed)},
  };
  if (r.sets_incomplete) rows.push_back({"Sets left out (an application not sent)", std::to_string(r.sets_incomplete)});
  if (!d.first_sent_at.empty()) rows.push_back({"Fieldwork", d.first_sent_at + " to " + d.last_sent_at});
  rows.push_back({"Observation window", std::to_string(d.window_days) + " days after each application"});
  rows.push_back({"Positive outcome", Joined(r.positive_codes)});
  if (!d.templates.empty()) rows.push_back({"CV templates", Joined(d.templates)});
  rows.push_back({"Significance level (alpha)", Plain(r.alpha)});
  rows.push_back({"Multiple-comparison correction", r.correction.empty() ? "none" : r.correction});
  return html::Heading("Counts") + html::Facts(rows);
}

std::string DesignStrata(const AnalysisResult& r, const ReportContext&) {
  const auto& d = r.design;
  if (d.strata.empty()) return "";
  std::string o;
  std::string current;
  HtmlTable t;
  // Records without a vacancy column stand one application to a vacancy.
  const std::string counted = r.records && r.vacancies == r.probes_planned ? "applications" : "vacancies";
  for (const auto& s : d.strata) {
    if (s.name != current) {
      if (!t.rows.empty()) o += RenderTable(t);
      t = HtmlTable{};
      current = s.name;
      t.caption = (counted == "vacancies" ? "Vacancies by " : "Applications by ") + s.name;
      t.headers = {s.name, counted};
      t.css_class = "compact";
    }
    t.rows.push_back({HeadCell(s.value), NumCell(std::to_string(s.vacancies))});
  }
  if (!t.rows.empty()) o += RenderTable(t);
  return html::Heading("Strata") +
         html::Para((r.records ? "The records were described by " : "Vacancies were described by ") + Joined(d.strata_columns) +
                    "; the analysis also reports results within each of these strata.") +
         "<div class=\"tables\">" + o + "</div>";
}

std::string DesignIntegrity(const AnalysisResult& r, const ReportContext&) {
  const auto& d = r.design;
  std::vector<std::pair<std::string, std::string>> rows;
  rows.push_back({"Design hash (SHA-256)", d.design_sha256.empty() ? "none (data imported without a design file)"
                                                                    : d.design_sha256});
  if (d.has_seed) rows.push_back({"Random seed", std::to_string(d.seed)});
  if (!d.plan_created_at.empty()) rows.push_back({"Plan made", d.plan_created_at});
  return html::Heading("Integrity") +
         html::Para("The design hash identifies the exact design file the plan was made from; anyone holding the "
                    "study folder can recompute it. The seed makes the random assignment repeatable.") +
         html::Facts(rows);
}

// The plan's balance: one small arm x variable table per variable, with its test.
std::string DesignBalance(const AnalysisResult& r, const ReportContext&) {
  if (!r.balance.present || r.balance.tables.empty()) return "";
  std::string o = "<div class=\"tables\">";
  for (const auto& t : r.balance.tables) {
    HtmlTable h;
    h.caption = t.title;
    h.headers = {"Group"};
    for (const auto& c : t.columns) h.headers.push_back(c);
    h.css_class = "compact";
    for (size_t i = 0; i < t.arms.size(); ++i) {
      std::vector<TableCell> row = {HeadCell(ArmName(t.arms[i]))};
      for (int64_t n : t.counts[i]) row.push_back(NumCell(std::to_string(n)));
      h.rows.push_back(row);
    }
    // Each table and its test line stay together as one item of the row.
    o += "<div class=\"balance-item\">" + RenderTable(h);
    char test[160];
    if (t.test.df == 0) std::snprintf(test, sizeof test, "no test (a single column)");
    else
      std::snprintf(test, sizeof test, "X\u00b2 = %.2f, df = %d, %s%s", t.test.statistic, t.test.df,
                    PEquals(t.test.p()).c_str(), t.test.p_monte_carlo ? " (Monte Carlo: small expected counts)" : "");
    o += "<p class=\"note\">" + EscapeHtml(test) + "</p></div>";
  }
  return html::Heading("Balance of the plan") +
         html::Para("Applications per group by template, position in the sending order, stratum and weekday of "
                    "sending, each with Pearson's chi-square test of independence. The plan balances templates and "
                    "sending order by construction, so those tables show X\u00b2 near 0 and p near 1.") +
         o + "</div>";
}

// The freeze and every deviation from it.
std::string DesignPreregistration(const AnalysisResult& r, const ReportContext&) {
  const auto& s = r.preregistration;
  if (!s.frozen)
    return html::Heading("Pre-registration") +
           html::Para("The analysis plan was not registered with 'twinprobe freeze', so this report cannot show that the "
                      "analysis was fixed before the data came in.");
  std::string o = html::Heading("Pre-registration") + "<div class=\"hashes\">" +
                  html::Facts({{"Frozen at", s.frozen_at},
                               {"Design hash at the freeze (SHA-256)", s.design_sha256},
                               {"Analysis plan hash (SHA-256)", s.analysis_sha256}}) +
                  "</div>";
  if (s.deviations.empty()) return o + html::Para("The analysis follows the frozen plan: no deviation.");
  HtmlTable d;
  d.caption = "Deviations from the frozen plan";
  d.headers = {"Kind", "Deviation"};
  for (const auto& x : s.deviations) d.rows.push_back({Cell(x.kind), Cell(x.what)});
  o += RenderTable(d);
  if (!s.exploratory.empty()) {
    HtmlTable e;
    e.caption = "Exploratory, not confirmatory (outside the frozen plan)";
    e.headers = {"Result", "Why"};
    for (const auto& x : s.exploratory) e.rows.push_back({Cell(x.what), Cell(x.why)});
    o += RenderTable(e);
  }
  return o;
}

}  // namespace twinprobe
