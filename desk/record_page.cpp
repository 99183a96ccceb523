// Record: find a probe, see its responses (a correction supersedes the
// response before it, and both stay), and enter a response through the same
// function as `record`, with its messages.
#include <algorithm>
#include <cctype>

#include "collector/declines.h"
#include "collector/history.h"
#include "collector/responses.h"
#include "core/clock.h"
#include "core/desk_actor.h"
#include "core/ethics_gate.h"
#include "desk/routes.h"
#include "planner/schedule.h"
#include "report/html_escape.h"

namespace twinprobe {
namespace {

constexpr size_t kMaxMatches = 50;

std::string Lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

// Which field a refusal of ResponseWriter::Add belongs beside. This reads the
// message the collector wrote; it decides nothing about the entry.
std::string RefusedField(const Error& e) {
  if (e.what.rfind("unknown probe", 0) == 0 || e.what.find("has no sending recorded") != std::string::npos)
    return "probe";
  if (e.what.find("response code") != std::string::npos) return "code";
  if (e.what.rfind("unknown channel", 0) == 0) return "channel";
  return "received_at";
}

std::string FindForm(const std::string& query, const std::string& error) {
  return "<form method=\"get\" action=\"/record\" class=\"row\">" +
         InputField({"find", "Find a probe", query, "probe (P00042), vacancy reference or profile name", error,
                     "search", "off", false}) +
         "<div class=\"field action\"><button type=\"submit\">Find</button></div></form>";
}

// Probes whose reference, vacancy or profile contains `query` (any case).
std::string Matches(const PageRequest& r, const std::string& query) {
  ScheduleQuery all;
  all.include_sent = true;
  auto rows = ListSchedule(r.store, all);
  if (!rows.ok()) return NoticeBox("error", RefusalText(rows.error()));
  const std::string q = Lower(query);
  std::string body;
  size_t n = 0, shown = 0;
  for (const ScheduledProbe& p : rows.value()) {
    if (Lower(p.probe).find(q) == std::string::npos && Lower(p.vacancy).find(q) == std::string::npos &&
        Lower(p.profile).find(q) == std::string::npos)
      continue;
    ++n;
    if (shown++ >= kMaxMatches) continue;
    body += "<tr><td><a href=\"/record?probe=" + UrlEncode(p.probe) + "\">" + UserText(p.probe) + "</a></td><td>" +
            UserText(p.vacancy) + "</td><td>" + UserText(p.employer) + "</td><td>" + UserText(p.arm) + "</td><td>" +
            UserText(p.profile) + "</td><td>" +
            (p.sent_at.empty() ? "<span class=\"absent\">not sent</span>" : EscapeHtml(p.sent_at)) +
            "</td><td><a href=\"/probe?id=" + UrlEncode(p.probe) + "\">history</a></td></tr>";
  }
  if (n == 0) return "<p class=\"absent\">No probe matches '" + UserText(query) + "'.</p>";
  return "<p>" + std::to_string(n) + (n == 1 ? " probe matches" : " probes match") +
         (n > kMaxMatches ? "; the first " + std::to_string(kMaxMatches) + " are shown" : "") +
         ".</p><div class=\"scroll\"><table class=\"data\"><thead><tr><th scope=\"col\">Probe</th>"
         "<th scope=\"col\">Vacancy</th><th scope=\"col\">Employer</th><th scope=\"col\">Arm</th>"
         "<th scope=\"col\">Profile</th><th scope=\"col\">Sent</th><th scope=\"col\">History</th></tr></thead><tbody>" +
         body + "</tbody></table></div>";
}

// The probe's responses, newest last; a superseded one is struck through
// and says which response replaced it.
std::string Responses(const ProbeHistory& h) {
  std::string rows;
  for (size_t i = 0; i < h.events.size(); ++i) {
    const HistoryEvent& e = h.events[i];
    if (e.kind != "response") continue;
    std::string state = e.current         ? "<span class=\"tag current\">current</span>"
                        : e.superseded_by ? "superseded by response " + std::to_string(e.superseded_by)
                                          : "";
    rows += std::string("<tr") + (e.superseded_by ? " class=\"superseded\"" : "") + "><td class=\"num\">" +
            std::to_string(e.id) + "</td><td class=\"struck\">" + UserText(e.code) + "</td><td>" + EscapeHtml(e.at) +
            "</td><td>" + UserText(e.channel) + "</td><td class=\"pre\">" + UserText(e.note) + "</td><td>" +
            UserText(e.entered_by) + "</td><td>" + state +
            (e.supersedes ? " (supersedes " + std::to_string(e.supersedes) + ")" : "") + "</td></tr>";
  }
  if (rows.empty()) return "<p class=\"absent\">No response recorded yet.</p>";
  return "<div class=\"scroll\"><table class=\"data\"><caption>Responses, oldest first</caption><thead><tr>"
         "<th scope=\"col\">#</th><th scope=\"col\">Code</th><th scope=\"col\">Received (UTC)</th>"
         "<th scope=\"col\">Channel</th><th scope=\"col\">Note</th><th scope=\"col\">Entered by</th>"
         "<th scope=\"col\">State</th></tr></thead><tbody>" +
         rows + "</tbody></table></div>";
}

struct EntryForm {
  ResponseEntry entry;
  std::string field, error;  // the refused field and the command's message
};

std::string ProbeSection(const PageRequest& r, const ProbeHistory& h, const EntryForm& form) {
  std::string body = "<dl class=\"facts\"><dt>Probe</dt><dd>" + UserText(h.probe) + "</dd><dt>Vacancy</dt><dd>" +
                     UserText(h.vacancy) + "</dd><dt>Employer</dt><dd>" + UserText(h.employer_key) +
                     "</dd><dt>Arm</dt><dd>" + UserText(h.arm) + "</dd><dt>Profile</dt><dd>" + UserText(h.profile) +
                     "</dd></dl><p><a href=\"/probe?id=" + UrlEncode(h.probe) + "\">Full history of " +
                     EscapeHtml(h.probe) + "</a></p>";
  body += "<h2>Responses</h2>" + Responses(h);
  const bool correcting = h.current_response >= 0;
  body +=
      std::string("<h2>") + (correcting ? "Enter a correction or a later response" : "Enter the response") + "</h2>";
  if (correcting)
    body += "<p class=\"note\">A new entry supersedes the current response; the old one stays in the store.</p>";
  auto err = [&](const char* f) { return form.field == f ? form.error : std::string(); };
  body += "<form method=\"post\" action=\"/record\">" + CsrfInput(r.session.csrf) +
          "<input type=\"hidden\" name=\"probe\" value=\"" + EscapeHtml(h.probe) + "\">";
  if (!err("probe").empty()) body += NoticeBox("error", err("probe"));
  body +=
      "<div class=\"row\">" +
      SelectField({"code", "Response", form.entry.code, "", err("code"), "text", "off", true}, r.design.outcomes.codes,
                  "Choose a code") +
      InputField({"received_at", "Received at (UTC)", form.entry.received_at,
                  "YYYY-MM-DD or YYYY-MM-DDTHH:MM; leave empty for now", err("received_at"), "text", "off", false}) +
      SelectField({"channel", "Channel", form.entry.channel, "", err("channel"), "text", "off", false},
                  ResponseChannels(), "not known") +
      "</div>" + TextAreaField({"note", "Note", form.entry.note, "what was said, kept with the response", "", "text"}) +
      "<button type=\"submit\">Record response</button></form>";
  return body;
}

DeskResponse Page(const PageRequest& r, int status, const std::string& notice, const std::string& probe,
                  const EntryForm& form) {
  std::string body = notice;
  const std::string query = r.Param("find");
  body += FindForm(query, "");
  if (!probe.empty()) {
    auto h = LoadHistory(r.store, r.design.outcomes, probe);
    if (!h.ok())
      body += NoticeBox("error", RefusalText(h.error()));
    else
      body += ProbeSection(r, h.value(), form);
  } else if (!query.empty()) {
    body += Matches(r, query);
  }
  return HtmlResponse(status, RenderPage(r.Frame(probe.empty() ? "Record" : "Record: " + probe, "record"), body));
}

}  // namespace

DeskResponse RecordPage(const PageRequest& r) {
  std::string probe = r.Param("probe");
  // A search for an exact probe reference opens it.
  const std::string query = r.Param("find");
  if (probe.empty() && !query.empty() && FindProbe(r.store, query) != 0) probe = query;
  return Page(r, 200, "", probe, {});
}

DeskResponse RecordEntry(const PageRequest& r) {
  EntryForm form;
  form.entry = ResponseEntry{r.Param("probe"),   r.Param("code"), r.Param("received_at"),
                             r.Param("channel"), r.Param("note"), "desk"};
  DeskActorScope actor(r.session.member);
  auto recorded = RecordResponse(r.store, r.design.outcomes, form.entry);
  if (!recorded.ok()) {
    form.field = RefusedField(recorded.error());
    form.error = RefusalText(recorded.error());
    const std::string probe = FindProbe(r.store, form.entry.probe_ref) ? form.entry.probe_ref : "";
    return Page(r, 400, NoticeBox("error", "Nothing was recorded: " + form.error), probe, form);
  }
  const RecordedResponse& v = recorded.value();
  // The same sentences as `record`.
  std::string text = "Recorded " + v.code + " for " + v.probe_ref + " at " + v.received_at +
                     (v.positive ? " (positive callback)" : "");
  if (v.superseded) text += "; it supersedes response " + std::to_string(v.superseded) + ", which is kept";
  text += ".";
  std::string notice = NoticeBox("ok", text);
  if (v.late)
    notice += NoticeBox("error", "The response came " + std::to_string(v.days_after_sending) + " days after " +
                                     v.probe_ref + " was sent, outside the observation window of " +
                                     std::to_string(r.design.outcomes.window_days) +
                                     " days; it is stored with the flag 'late'.");
  const EthicsBlock& ethics = r.design.ethics;
  if (v.positive && ethics.decline_within_hours > 0)
    notice += NoticeBox("error", DeclineReminder(v.code, v.probe_ref,
                                                 DeclineDeadline(ethics, ParseIsoTime(v.received_at).value_or(0)),
                                                 ethics.decline_within_hours, "mark it on the Declines page"));
  return Page(r, 200, notice, v.probe_ref, {});
}

}  // namespace twinprobe
