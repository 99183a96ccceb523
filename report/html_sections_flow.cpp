// The flow section of the HTML report: where the fieldwork stands (open
// sets, early states) and the flow diagram, in the words of the text report.
#include "report/fieldwork_state.h"
#include "report/html_parts.h"
#include "report/html_sections.h"
#include "report/html_table.h"
#include "report/plural.h"
#include "report/svg_flow.h"

namespace twinprobe {

std::string FlowDiagramPart(const AnalysisResult& r, const ReportContext&) {
  std::string o;
  if (const std::string early = EarlyStateSentence(r); !early.empty()) o += html::Para(early);
  if (const std::string open = OpenSetsSentence(r); !open.empty()) o += html::Para(open);
  const StudyFlow& f = r.flow;
  auto exits = [&](std::initializer_list<const char*> reasons) {
    std::vector<std::string> lines;
    for (const char* reason : reasons)
      for (const auto& x : f.exclusions)
        if (x.reason == reason && x.sets > 0) lines.push_back(Count(x.sets, "set", "sets") + ": " + x.label);
    return lines;
  };
  svg::FlowDiagram d;
  d.id = "flow-chart";
  d.title = "Flow of the study";
  std::string description;
  for (const std::string& line : FlowTextLines(f)) description += (description.empty() ? "" : "; ") + line;
  d.description = description;
  d.stages = {{Count(f.vacancies_planned, "vacancy", "vacancies") + " planned", exits({"not_sent", "incomplete", "withdrawn"})},
              {Count(f.sets_sent, "set", "sets") + " with every application sent", exits({"still_open"})},
              {Count(f.sets_closed, "set", "sets") + " closed", {}},
              {Count(f.sets_analysed, "set", "sets") + " analysed", {}}};
  // The same counts as a table beside the diagram (screen readers, copying).
  HtmlTable table;
  table.caption = "Flow of the study";
  table.headers = {"Stage or reason left out", "Count"};
  table.rows.push_back({HeadCell("Vacancies planned"), NumCell(std::to_string(f.vacancies_planned))});
  for (const auto& x : f.exclusions)
    table.rows.push_back({HeadCell("Left out: " + x.label), NumCell(std::to_string(x.sets))});
  table.rows.push_back({HeadCell("Sets with every application sent"), NumCell(std::to_string(f.sets_sent))});
  table.rows.push_back({HeadCell("Sets closed"), NumCell(std::to_string(f.sets_closed))});
  table.rows.push_back({HeadCell("Sets analysed"), NumCell(std::to_string(f.sets_analysed))});
  o += html::Figure("figure-flow", "Flow of the study: each set of applications from the plan to the analysis.",
                    svg::RenderFlowDiagram(d), RenderTable(table));
  if (f.responses_late > 0)
    o += html::Para(Count(f.responses_late, "answer", "answers") + " came after the " + std::to_string(f.window_days) +
                    "-day window: kept, marked late, and counted as no answer.");
  return o;
}

}  // namespace twinprobe
