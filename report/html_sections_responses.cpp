// The responses section (outcome codes, time to first response) and the
// employers section of the HTML report.
#include <cstdio>

#include "report/html_escape.h"
#include "report/html_parts.h"
#include "report/employer_flip_text.h"
#include "report/html_sections.h"
#include "report/html_table.h"
#include "report/plain_summary.h"
#include "report/svg_bar_chart.h"
#include "report/svg_step_chart.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Days(double d) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", d);
  return buf;
}

std::string CountShare(int64_t n, double share) { return std::to_string(n) + " (" + FormatPercent(share) + ")"; }

// One step chart and its milestone table, for first responses of any kind
// (positive = false) or first positive responses.
std::string TimeFigure(const AnalysisResult& r, bool positive) {
  const auto& rt = r.response_times;
  svg::StepChart chart;
  chart.id = positive ? "chart-first-positive" : "chart-first-response";
  chart.title = positive ? "Share of applications with a positive answer, by days since sending"
                         : "Share of applications with any answer, by days since sending";
  chart.x_label = "days since the application was sent";
  chart.y_label = positive ? "answered positively" : "answered";
  chart.x_max = rt.window_days;
  chart.y_percent = true;
  // Weekly guides read best for the usual 28-day window.
  if (rt.window_days % 7 == 0 && rt.window_days >= 14)
    for (int day = 0; day <= rt.window_days; day += 7) chart.x_marks.push_back(day);
  std::string desc = "Cumulative step chart over the " + std::to_string(rt.window_days) + "-day observation window.";
  HtmlTable t;
  t.caption = positive ? "First positive answer by day" : "First answer by day";
  t.headers = {"by day"};
  for (const auto& a : rt.arms) t.headers.push_back(ArmName(r, a.label));
  for (size_t i = 0; i < rt.arms.size(); ++i) {
    const auto& a = rt.arms[i];
    svg::StepSeries s;
    s.label = ArmName(r, a.label);
    for (const auto& p : positive ? a.positive : a.any) s.points.push_back({p.day, p.share});
    const auto& last = a.milestones.empty() ? ResponseMilestone{} : a.milestones.back();
    s.end_text = FormatPercent(positive ? last.positive_share : last.any_share);
    desc += " " + s.label + ": " + s.end_text + " of " + std::to_string(a.probes_sent) + " applications by day " +
            std::to_string(rt.window_days) + ".";
    chart.series.push_back(s);
  }
  const size_t rows = rt.arms.empty() ? 0 : rt.arms.front().milestones.size();
  for (size_t m = 0; m < rows; ++m) {
    std::vector<TableCell> row = {NumCell(std::to_string(rt.arms.front().milestones[m].day))};
    for (const auto& a : rt.arms) {
      const auto& ms = a.milestones[m];
      row.push_back(NumCell(positive ? CountShare(ms.positive, ms.positive_share) : CountShare(ms.any, ms.any_share)));
    }
    t.rows.push_back(row);
  }
  chart.description = desc;
  return html::Figure(positive ? "fig-first-positive" : "fig-first-response",
                      positive ? "Time to the first positive answer (info request, invitation or offer), by group."
                               : "Time to the first answer of any kind (including rejections), by group.",
                      svg::RenderStepChart(chart), RenderTable(t));
}

}  // namespace

std::string ResponseCodes(const AnalysisResult& r, const ReportContext&) {
  const auto& rt = r.response_times;
  if (rt.arms.empty() || rt.arms.front().probes_sent == 0)
    return html::Absent("No application has been marked as sent yet, so there are no responses to show.");
  svg::BarChart chart;
  chart.id = "chart-codes";
  chart.title = "Current outcome of every sent application, by group";
  chart.axis_label = "applications";
  HtmlTable t;
  t.caption = "Outcome codes by group (sent applications)";
  t.headers = {"outcome"};
  for (const auto& a : rt.arms) {
    chart.series_labels.push_back(ArmName(r, a.label));
    t.headers.push_back(ArmName(r, a.label));
  }
  std::string desc = "Grouped bar chart.";
  const auto& codes = rt.arms.front().codes;
  for (size_t c = 0; c < codes.size(); ++c) {
    svg::BarGroup g;
    g.label = codes[c].code;
    std::vector<TableCell> row = {HeadCell(codes[c].code)};
    desc += " " + codes[c].code + ":";
    for (const auto& a : rt.arms) {
      const int64_t n = c < a.codes.size() ? a.codes[c].probes : 0;
      g.values.push_back(static_cast<double>(n));
      g.value_texts.push_back(std::to_string(n));
      row.push_back(NumCell(std::to_string(n)));
      desc += " " + ArmName(r, a.label) + " " + std::to_string(n);
    }
    desc += ".";
    chart.groups.push_back(g);
    t.rows.push_back(row);
  }
  std::vector<TableCell> total = {HeadCell("sent")};
  for (const auto& a : rt.arms) total.push_back(NumCell(std::to_string(a.probes_sent)));
  t.rows.push_back(total);
  chart.description = desc;
  return html::Para("Every sent application ends with one current outcome: the newest recorded response (a corrected "
                    "entry replaces what it corrects, and both stay in the store), or \"none\" when nothing came back.") +
         html::Figure("fig-codes", "What came back to each group's applications.", svg::RenderBarChart(chart),
                      RenderTable(t));
}

std::string ResponseTimesChart(const AnalysisResult& r, const ReportContext&) {
  const auto& rt = r.response_times;
  if (!rt.available || rt.arms.empty())
    return html::Heading("Time to first response") +
           html::Absent("No send times are recorded (for example, outcomes were imported without them), so the time "
                        "to first response cannot be shown.");
  std::string o = html::Heading("Time to first response");
  std::string medians;
  for (const auto& a : rt.arms) {
    medians += medians.empty() ? "Within the window, " : "; ";
    medians += ArmName(r, a.label) + ": " + std::to_string(a.responded) + " of " + std::to_string(a.probes_sent) +
               " answered" +
               (a.median_days >= 0 ? ", half of them within " + Days(a.median_days) + " days" : "") +
               (a.late ? ", " + std::to_string(a.late) + " answered only after the window (counted as none)" : "");
  }
  o += html::Para("The curves rise each time an application receives its first answer. They run over the " +
                  std::to_string(rt.window_days) +
                  "-day observation window; an answer after the window counts as no answer. " + medians + ".");
  o += TimeFigure(r, false);
  o += TimeFigure(r, true);
  return o;
}

std::string EmployerTable(const AnalysisResult& r, const ReportContext& ctx) {
  const auto& e = r.employers;
  std::string o = html::Para(
      std::to_string(e.employers) + " employers had at least one analysed pair; " +
      std::to_string(e.employers_discordant) +
      " of them treated the two applicants differently at least once. A single unequal pair is weak evidence about "
      "a single employer: even an employer without any preference answers one applicant and not the other now and "
      "then. This table supports follow-up testing, not public naming.");
  if (std::string flip = EmployerFlipSentence(r); !flip.empty()) o += html::Para(flip);
  o += ctx.reveal_employers
           ? html::Para("Employer names are shown because the report was made with --reveal-employers; that choice is "
                        "recorded in the study's audit chain.",
                        "warning")
           : html::Para("Employers appear by keyed pseudonym. Their names stay in the study store and appear only when "
                        "a report is made with --reveal-employers, which is recorded in the audit chain.");
  // One unequal pair is what an employer without any preference produces now
  // and then, so the table lists only employers with more than one.
  HtmlTable t;
  t.caption = "Employers with more than one unequal pair";
  t.headers = {"employer", "pairs", "only " + ArmName(r, r.reference_label), "only " + ArmName(r, r.other_label), "both",
               "neither"};
  for (const auto& x : e.discordant) {
    if (x.discordant < 2) break;  // sorted, most unequal first
    std::string who = x.pseudonym;
    if (ctx.reveal_employers) {
      auto it = ctx.employer_names.find(x.pseudonym);
      if (it != ctx.employer_names.end() && !it->second.empty()) who = it->second + " (" + x.pseudonym + ")";
    }
    t.rows.push_back({HeadCell(who), NumCell(std::to_string(x.vacancies)), NumCell(std::to_string(x.table.b)),
                      NumCell(std::to_string(x.table.c)), NumCell(std::to_string(x.table.a)),
                      NumCell(std::to_string(x.table.d))});
  }
  if (t.rows.empty())
    o += html::Para("No employer had more than one unequal pair. The JSON report (report --json) lists, by pseudonym, "
                    "every employer with one.");
  else
    o += RenderTable(t) + html::Para("The JSON report (report --json) lists, by pseudonym, every employer with one or "
                                     "more unequal pairs.",
                                     "note");
  return o;
}

}  // namespace twinprobe
