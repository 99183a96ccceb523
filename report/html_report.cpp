#include "report/html_report.h"

#include "report/chain_warning.h"
#include "report/html_escape.h"
#include "report/html_sections.h"
#include "report/html_style.h"
#include "report/plain_summary.h"

namespace twinprobe {
namespace {

bool Applies(const HtmlSection& s, const AnalysisResult& r) { return !s.applies || s.applies(r); }

std::string Masthead(const AnalysisResult& r, const ReportContext& ctx) {
  std::string o = std::string("<header class=\"masthead\"><p class=\"kicker\">") +
                  (r.records ? "Applicant records report" : "Correspondence test report") + "</p><h1>" +
                  UserText(r.title) + "</h1><p class=\"meta\">Study " + UserText(r.study_id) + " · " +
                  EscapeHtml(r.kind) + " design · ";
  // Records: as many applications as vacancies means no vacancy column.
  if (r.records) o += EscapeHtml(RecordsExtent(r.probes_planned, r.vacancies)) + " · ";
  else o += std::to_string(r.vacancies) + " vacancies · ";
  o += "made " + EscapeHtml(ctx.generated_at.empty() ? "at an unknown time" : ctx.generated_at) + " with twinprobe " +
       EscapeHtml(ctx.tool_version) + "</p>";
  if (ctx.reveal_employers)
    o += "<p class=\"banner\" role=\"note\"><strong>This copy names employers.</strong> It was made with "
         "--reveal-employers, which is recorded in the study's audit chain. Share it only with people entitled to "
         "see the names.</p>";
  if (!ctx.audit_intact)
    o += "<p class=\"banner\" role=\"note\"><strong>" + std::string(kBrokenChainLead) + "</strong> " +
         EscapeHtml(BrokenChainDetail(ctx)) + "</p>";
  return o + "</header>";
}

std::string Contents(const AnalysisResult& r) {
  std::string o = "<nav class=\"toc\" aria-label=\"Contents\"><h2>Contents</h2><ol>";
  for (const auto& s : HtmlSections())
    if (Applies(s, r)) o += "<li><a href=\"#" + std::string(s.id) + "\">" + EscapeHtml(s.title) + "</a></li>";
  return o + "</ol></nav>";
}

}  // namespace

std::vector<std::string> HtmlSectionIds(const AnalysisResult& r) {
  std::vector<std::string> ids;
  for (const auto& s : HtmlSections())
    if (Applies(s, r)) ids.push_back(s.id);
  return ids;
}

std::string RenderHtmlReport(const AnalysisResult& r, const ReportContext& ctx) {
  std::string o =
      "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
      "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">"
      "<meta name=\"generator\" content=\"twinprobe " + EscapeHtml(ctx.tool_version) + "\">"
      "<title>" + EscapeHtml(r.title) + (r.records ? " \u2014 report on application records" : " \u2014 correspondence test report") + "</title><style>" + ReportCss() +
      "</style></head>\n<body>";
  o += Masthead(r, ctx);
  o += Contents(r);
  o += "<main>";
  for (const auto& s : HtmlSections()) {
    if (!Applies(s, r)) continue;
    o += "\n<section id=\"" + std::string(s.id) + "\"><h2>" + EscapeHtml(s.title) + "</h2>";
    for (PartRenderer part : s.parts) o += part(r, ctx);
    o += "</section>";
  }
  o += "</main>\n<footer><p>Made with twinprobe " + EscapeHtml(ctx.tool_version) +
       ". Numbers in this file come from the study store through 'twinprobe report'; nothing was typed in by "
       "hand.</p></footer></body></html>\n";
  return o;
}

}  // namespace twinprobe
