#include "report/stages_report.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "report/html_parts.h"
#include "report/html_table.h"
#include "report/json_number.h"
#include "report/p_value.h"
#include "report/plain_summary.h"
#include "report/svg_bar_chart.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

double Share(int64_t part, int64_t whole) {
  return whole > 0 ? static_cast<double>(part) / static_cast<double>(whole) : std::nan("");
}

std::string Rate(int64_t part, int64_t whole) {
  return std::to_string(part) + "/" + std::to_string(whole) + " (" +
         (whole > 0 ? FormatPercent(Share(part, whole)) : std::string("-")) + ")";
}

std::string Adjusted(double p) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3g", p);
  return buf;
}

}  // namespace

std::string RenderStagesText(const AnalysisResult& r) {
  const HiringStages& h = r.stages;
  if (!h.present) return "";
  std::ostringstream o;
  o << "\nHiring stages (reached this stage: among all applicants, and among those at the previous stage; "
       "Fisher's exact test, two-sided, against "
    << ArmName(r, r.arms.front().label) << "; p adjusted with " << h.correction << " across the stages):\n";
  for (size_t k = 0; k < h.stages.size(); ++k) {
    const HiringStage& s = h.stages[k];
    o << "  " << s.name << ":";
    for (const StageGroup& g : s.groups) {
      o << " " << ArmName(r, g.label) << " " << Rate(g.reached, g.applications);
      if (k > 0) o << ", of previous " << Rate(g.reached, g.previous);
      o << ";";
    }
    o << "\n";
    for (const StageTest& t : s.tests)
      o << "    " << ArmName(r, t.other_label) << ": among all " << PEquals(t.among_all.p) << " (adjusted "
        << Adjusted(t.among_all_adjusted) << "); among the previous stage " << PEquals(t.among_previous.p)
        << " (adjusted " << Adjusted(t.among_previous_adjusted) << ")\n";
  }
  if (h.unknown_outcomes)
    o << "  " << h.unknown_outcomes << " applications carry an outcome that is no stage and are not counted.\n";
  return o.str();
}

nlohmann::json StagesJson(const HiringStages& h) {
  if (!h.present) return nullptr;
  nlohmann::json stages = nlohmann::json::array();
  for (const HiringStage& s : h.stages) {
    nlohmann::json groups = nlohmann::json::array(), tests = nlohmann::json::array();
    for (const StageGroup& g : s.groups)
      groups.push_back({{"group", g.label},
                        {"reached", g.reached},
                        {"at_previous_stage", g.previous},
                        {"applications", g.applications},
                        {"rate_among_all", JsonNumber(Share(g.reached, g.applications))},
                        {"rate_among_previous", JsonNumber(Share(g.reached, g.previous))}});
    for (const StageTest& t : s.tests)
      tests.push_back({{"other_group", t.other_label},
                       {"test", "Fisher's exact test, two-sided"},
                       {"p_among_all", JsonNumber(t.among_all.p.p)},
                       {"p_among_all_adjusted", JsonNumber(t.among_all_adjusted)},
                       {"p_among_previous", JsonNumber(t.among_previous.p.p)},
                       {"p_among_previous_adjusted", JsonNumber(t.among_previous_adjusted)}});
    stages.push_back({{"stage", s.name}, {"groups", groups}, {"tests", tests}});
  }
  return {{"correction", h.correction}, {"stages", stages}, {"unknown_outcomes", h.unknown_outcomes}};
}

std::string StagesFunnel(const AnalysisResult& r, const ReportContext&) {
  const HiringStages& h = r.stages;
  if (!h.present) return "";
  svg::BarChart chart;
  chart.id = "chart-stages";
  chart.title = "Share of each group's applicants who reached each stage";
  chart.axis_label = "share of applicants";
  chart.percent = true;
  chart.axis_max = 1;
  for (const StageGroup& g : h.stages.front().groups) chart.series_labels.push_back(ArmName(r, g.label));
  std::string desc = "Funnel of hiring stages by group:";
  HtmlTable t;
  t.caption = "Selection rates by stage";
  t.headers = {"stage", "group", "reached / applicants", "reached / at the previous stage", "Fisher p (all)",
               "Fisher p (previous)"};
  for (const HiringStage& s : h.stages) {
    svg::BarGroup bars;
    bars.label = s.name;
    for (size_t a = 0; a < s.groups.size(); ++a) {
      const StageGroup& g = s.groups[a];
      const double share = Share(g.reached, g.applications);
      bars.values.push_back(share);
      bars.value_texts.push_back(std::isnan(share) ? "" : FormatPercent(share));
      desc += " " + s.name + ", " + ArmName(r, g.label) + " " + Rate(g.reached, g.applications) + ";";
      std::string p_all = "reference", p_prev = "reference";
      if (a > 0 && !s.tests.empty()) {
        p_all = FormatP(s.tests[a - 1].among_all.p) + " (adj. " + Adjusted(s.tests[a - 1].among_all_adjusted) + ")";
        p_prev = FormatP(s.tests[a - 1].among_previous.p) + " (adj. " +
                 Adjusted(s.tests[a - 1].among_previous_adjusted) + ")";
      } else if (s.tests.empty()) {
        p_all = p_prev = "";
      }
      t.rows.push_back({HeadCell(s.name), HeadCell(ArmName(r, g.label)), NumCell(Rate(g.reached, g.applications)),
                        NumCell(&s == &h.stages.front() ? std::string() : Rate(g.reached, g.previous)), NumCell(p_all),
                        NumCell(p_prev)});
    }
    chart.groups.push_back(std::move(bars));
  }
  chart.description = desc;
  return html::Para("Each application's outcome is the furthest stage it reached. The chart shows, for each group, "
                    "the share of all its applicants who reached each stage; the table adds the share of those at "
                    "the previous stage who passed the step, with Fisher's exact test of each (two-sided, p adjusted "
                    "with " + h.correction + " across the stages). Differences may reflect qualifications the data "
                    "do not hold.") +
         html::Figure("fig-stages", "Hiring funnel by group.", svg::RenderBarChart(chart), RenderTable(t));
}

}  // namespace twinprobe
