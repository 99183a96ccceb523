// Study: how far the fieldwork is, and the latest report. Analysis itself
// stays in `analyze` and `report`.
#include <filesystem>

#include "analysis/flow.h"
#include "core/audit.h"
#include "core/fieldwork.h"
#include "core/desk_counts.h"
#include "desk/routes.h"
#include "report/html_escape.h"

namespace twinprobe {
namespace {

// The newest .html file directly in reports/ (by modification time), or "".
std::string LatestReport(const std::string& study_dir) {
  namespace fs = std::filesystem;
  std::error_code ec;
  fs::path dir = fs::path(study_dir) / "reports";
  std::string best;
  fs::file_time_type best_time{};
  for (fs::directory_iterator it(dir, ec), end; !ec && it != end; it.increment(ec)) {
    if (!it->is_regular_file(ec) || it->is_symlink(ec) || it->path().extension() != ".html") continue;
    auto t = it->last_write_time(ec);
    if (best.empty() || t > best_time) {
      best = it->path().filename().string();
      best_time = t;
    }
  }
  return best;
}

std::string KeyFigure(int64_t n, const std::string& what, const std::string& small) {
  return "<div class=\"keyfig\"><span class=\"big\">" + std::to_string(n) + "</span><span class=\"what\">" +
         EscapeHtml(what) + "</span><span class=\"small\">" + EscapeHtml(small) + "</span></div>";
}

}  // namespace

DeskResponse StudyPage(const PageRequest& r) {
  const DeskCounts f = ReadDeskCounts(r.store, r.design.outcomes);
  std::string body = "<div class=\"keyfigs\">" + KeyFigure(f.planned, "probes planned", "in the current plan") +
                     KeyFigure(f.sent, "sent", std::to_string(f.planned - f.sent) + " still to send") +
                     KeyFigure(f.responded, "with a response", "the current response of each probe") +
                     KeyFigure(f.positive, "positive callbacks", std::to_string(f.declined) + " declined so far") +
                     "</div>";
  // Sets closed and analysable by the same rule as `analyze` (core/fieldwork.h:
  // a probe is open until answered or its window ends on the study clock).
  const StudyFlow flow = ComputeFlow(ReadFieldwork(r.store, r.design.outcomes), r.design.outcomes.window_days);
  body += "<div class=\"keyfigs\">" +
          KeyFigure(flow.vacancies_planned, "vacancies planned", "one set of applications each") +
          KeyFigure(flow.sets_sent, "sets sent", "every application of the set sent") +
          KeyFigure(flow.sets_closed, "sets closed", "answered, or the " + std::to_string(flow.window_days) +
                                                         "-day window is over") +
          KeyFigure(flow.sets_analysed, "sets analysable", "what analyze would count now") + "</div>";
  body += "<h2>Latest report</h2>";
  const std::string report = LatestReport(r.study_dir);
  if (report.empty())
    body +=
        "<p class=\"absent\">No HTML report in reports/ yet. Whoever runs the analysis makes one with "
        "<code>twinprobe report --out reports/report.html</code>.</p>";
  else
    body += "<p><a href=\"/files/reports/" + UrlEncode(report) + "\">" + UserText(report) + "</a></p>";
  body += "<h2>The record</h2><dl class=\"facts\"><dt>Study</dt><dd>" + UserText(r.design.study_id) +
          "</dd><dt>Audit entries</dt><dd>" + std::to_string(f.entries) +
          "</dd><dt>Chain head</dt><dd class=\"hash\">" + EscapeHtml(AuditHead(r.store)) +
          "</dd><dt>Field team</dt><dd>";
  for (size_t i = 0; i < r.design.team.size(); ++i) body += (i ? ", " : "") + UserText(r.design.team[i]);
  body +=
      "</dd></dl><p class=\"note\">Analysis stays with the commands: <code>twinprobe analyze</code>, "
      "<code>twinprobe report</code>, and <code>twinprobe verify</code> to check the audit chain.</p>";
  return HtmlResponse(200, RenderPage(r.Frame("Study", "study"), body));
}

}  // namespace twinprobe
