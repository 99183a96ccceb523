// Probe: everything the store holds about one probe, as `history`.
#include "collector/history.h"
#include "desk/routes.h"
#include "report/html_escape.h"

namespace twinprobe {

DeskResponse ProbePage(const PageRequest& r) {
  const std::string probe = r.Param("id");
  auto loaded = LoadHistory(r.store, r.design.outcomes, probe);
  if (!loaded.ok())
    return HtmlResponse(404, RenderPage(r.Frame("Probe", ""), NoticeBox("error", RefusalText(loaded.error())) +
                                                                  "<p><a href=\"/record\">Find a probe</a></p>"));
  const ProbeHistory& h = loaded.value();
  std::string body = "<dl class=\"facts\"><dt>Vacancy</dt><dd>" + UserText(h.vacancy) + "</dd><dt>Employer</dt><dd>" +
                     UserText(h.employer_key) + "</dd><dt>Arm</dt><dd>" + UserText(h.arm) +
                     "</dd><dt>Profile</dt><dd>" + UserText(h.profile) + "</dd><dt>Planned</dt><dd>" +
                     EscapeHtml(h.planned_at) + "</dd>";
  for (const auto& [name, value] : h.strata) body += "<dt>" + UserText(name) + "</dt><dd>" + UserText(value) + "</dd>";
  body += "</dl><p><a href=\"/record?probe=" + UrlEncode(h.probe) + "\">Enter a response for " + EscapeHtml(h.probe) +
          "</a></p><h2>History</h2>";
  if (h.events.empty())
    body += "<p class=\"absent\">Nothing recorded yet.</p>";
  else {
    body +=
        "<div class=\"scroll\"><table class=\"data\"><caption>In the order it was entered</caption><thead><tr>"
        "<th scope=\"col\">Audit entry</th><th scope=\"col\">What</th><th scope=\"col\">When (UTC)</th>"
        "<th scope=\"col\">Details</th><th scope=\"col\">Entered by</th><th scope=\"col\">Entered at</th>"
        "</tr></thead><tbody>";
    for (const HistoryEvent& e : h.events) {
      std::string what = e.kind, details;
      if (e.kind == "response") {
        what = "response " + std::to_string(e.id);
        details = UserText(e.code) + (e.positive ? " (positive)" : "") +
                  (e.channel.empty() ? "" : ", by " + UserText(e.channel)) +
                  (e.flags.empty() ? "" : ", flags: " + UserText(e.flags)) + ", " + UserText(e.origin);
        if (e.supersedes) details += "; supersedes response " + std::to_string(e.supersedes);
        if (e.superseded_by) details += "; superseded by response " + std::to_string(e.superseded_by);
        if (e.current) details += " <span class=\"tag current\">current</span>";
        if (!e.note.empty()) details += "<div class=\"pre\">Note: " + UserText(e.note) + "</div>";
        if (e.note_purged) details += "<div class=\"absent\">note removed by purge</div>";
      } else if (e.kind == "decline") {
        what = "declined";
        details = UserText(e.channel);
      }
      body += std::string("<tr") + (e.superseded_by ? " class=\"superseded\"" : "") + "><td class=\"num\">" +
              std::to_string(e.audit_seq) + "</td><td class=\"struck\">" + EscapeHtml(what) + "</td><td>" +
              EscapeHtml(e.at) + "</td><td class=\"wrap\">" + details + "</td><td>" + UserText(e.entered_by) +
              "</td><td>" + EscapeHtml(e.entered_at) + "</td></tr>";
    }
    body += "</tbody></table></div>";
  }
  return HtmlResponse(200, RenderPage(r.Frame("Probe " + h.probe, ""), body));
}

}  // namespace twinprobe
