// Today: what to send (as `schedule`), each with its rendered material, and
// a "sent at" form for one or several probes (as `sent`).
#include <algorithm>
#include <filesystem>

#include "collector/declines.h"
#include "collector/responses.h"
#include "core/clock.h"
#include "core/desk_actor.h"
#include "desk/routes.h"
#include "planner/schedule.h"
#include "report/html_escape.h"

namespace twinprobe {
namespace {

constexpr size_t kMaxDueRows = 200;  // a page, not the whole plan
constexpr size_t kUpcomingRows = 10;

std::string ShortTime(const std::string& iso) {
  return iso.size() >= 16 ? iso.substr(0, 10) + " " + iso.substr(11, 5) : iso;
}

std::string MaterialLink(const std::string& study_dir, const std::string& probe) {
  namespace fs = std::filesystem;
  std::error_code ec;
  if (!fs::is_regular_file(fs::path(study_dir) / "materials" / (probe + ".html"), ec))
    return "<span class=\"absent\">not rendered</span>";
  return "<a href=\"/files/materials/" + UrlEncode(probe) + ".html\">open<span class=\"visually-hidden\"> " +
         EscapeHtml(probe) + "</span></a>";
}

std::string ProbeRows(const PageRequest& r, const std::vector<ScheduledProbe>& rows, size_t from, size_t to,
                      const std::vector<std::string>& checked) {
  std::string h;
  for (size_t i = from; i < to && i < rows.size(); ++i) {
    const ScheduledProbe& p = rows[i];
    const std::string id = "sent-" + p.probe;
    const bool is_checked = std::find(checked.begin(), checked.end(), p.probe) != checked.end();
    h += "<tr><td class=\"check\"><input type=\"checkbox\" name=\"probe\" id=\"" + EscapeHtml(id) + "\" value=\"" +
         EscapeHtml(p.probe) + "\"" + (is_checked ? " checked" : "") + "></td><td><label for=\"" + EscapeHtml(id) +
         "\">" + UserText(p.probe) + "</label></td><td class=\"num\">" + EscapeHtml(ShortTime(p.planned_at)) +
         "</td><td>" + UserText(p.vacancy) + "</td><td>" + UserText(p.employer) + "</td><td>" + UserText(p.arm) +
         "</td><td>" + UserText(p.profile) + "</td><td>" + UserText(p.mailbox) + "</td><td>" +
         MaterialLink(r.study_dir, p.probe) + "</td></tr>";
  }
  return h;
}

const char* kProbeHead =
    "<thead><tr><th scope=\"col\"><span class=\"visually-hidden\">Select</span></th><th scope=\"col\">Probe</th>"
    "<th scope=\"col\">Planned (UTC)</th><th scope=\"col\">Vacancy</th><th scope=\"col\">Employer</th>"
    "<th scope=\"col\">Arm</th><th scope=\"col\">Profile</th><th scope=\"col\">Mailbox</th>"
    "<th scope=\"col\">Material</th></tr></thead>";

std::string TodayBody(const PageRequest& r, const std::string& notice_html, const std::string& at_value,
                      const std::string& at_error, const std::vector<std::string>& checked) {
  std::string h = notice_html;
  const int64_t now = NowEpoch();
  const int hours = r.design.ethics.decline_within_hours;
  if (hours > 0) {
    auto pending = PendingDeclines(r.store, r.design.outcomes, hours, now);
    size_t overdue = 0;
    for (const auto& d : pending) overdue += d.overdue;
    if (overdue)
      h += "<p class=\"banner\"><strong>Overdue:</strong> " + std::to_string(overdue) +
           (overdue == 1 ? " invitation or offer was" : " invitations or offers were") + " not declined within " +
           std::to_string(hours) + " hours. <a href=\"/declines\">Decline now</a>.</p>";
    else if (!pending.empty())
      h += "<p class=\"notice ok\">" + std::to_string(pending.size()) +
           (pending.size() == 1 ? " invitation or offer" : " invitations or offers") +
           " to decline: <a href=\"/declines\">Declines</a>.</p>";
  }
  ScheduleQuery all;
  auto rows = ListSchedule(r.store, all);
  if (!rows.ok()) return h + NoticeBox("error", RefusalText(rows.error()));
  const std::string today = FormatIsoTime(now).substr(0, 10);
  const int64_t end_of_day = (now / 86400 + 1) * 86400;
  size_t due = 0;
  while (due < rows.value().size() && ParseIsoTime(rows.value()[due].planned_at).value_or(0) < end_of_day) ++due;
  h += "<p>Now: " + EscapeHtml(ShortTime(FormatIsoTime(now))) + " UTC. " + std::to_string(due) +
       (due == 1 ? " probe is" : " probes are") + " due by the end of " + EscapeHtml(today) +
       ". Send each with its material, then tick it and say when it went out.</p>";
  h += "<form method=\"post\" action=\"/today\">" + CsrfInput(r.session.csrf);
  h += "<h2>Due by the end of today</h2>";
  if (due == 0)
    h += "<p class=\"absent\">Nothing is due.</p>";
  else {
    h += "<div class=\"scroll\"><table class=\"data\"><caption>Due probes, oldest first</caption>" +
         std::string(kProbeHead) + "<tbody>" + ProbeRows(r, rows.value(), 0, std::min(due, kMaxDueRows), checked) +
         "</tbody></table></div>";
    if (due > kMaxDueRows)
      h += "<p class=\"note\">" + std::to_string(due - kMaxDueRows) +
           " more are due; they appear here once these are marked sent.</p>";
  }
  if (due < rows.value().size()) {
    h +=
        "<h2>Coming up</h2><div class=\"scroll\"><table class=\"data\"><caption>The next probes in the plan</caption>" +
        std::string(kProbeHead) + "<tbody>" + ProbeRows(r, rows.value(), due, due + kUpcomingRows, checked) +
        "</tbody></table></div>";
  }
  h += "<div class=\"row\">" +
       InputField({"sent_at", "Sent at (UTC)", at_value, "YYYY-MM-DD or YYYY-MM-DDTHH:MM; leave empty for now",
                   at_error, "text", "off", false}) +
       "<div class=\"field action\"><button type=\"submit\">Mark the ticked probes as sent</button></div></div></form>";
  return h;
}

}  // namespace

DeskResponse TodayPage(const PageRequest& r, const std::string& notice_html) {
  return HtmlResponse(200, RenderPage(r.Frame("Today", "today"), TodayBody(r, notice_html, "", "", {})));
}

DeskResponse MarkSent(const PageRequest& r) {
  const std::vector<std::string> probes = r.Params("probe");
  const std::string at = r.Param("sent_at");
  if (probes.empty())
    return HtmlResponse(
        400,
        RenderPage(r.Frame("Today", "today"),
                   TodayBody(r, NoticeBox("error", "Tick at least one probe; nothing was recorded."), at, "", {})));
  DeskActorScope actor(r.session.member);
  std::string landed;
  for (const std::string& probe : probes) {
    // Each probe is its own entry, exactly as one `sent` command per probe.
    auto s = RecordSending(r.store, probe, at, r.design.schedule.early_days);
    if (!s.ok()) {
      std::string notice = landed.empty() ? "" : NoticeBox("ok", landed);
      notice += NoticeBox("error", probe + " was not marked sent: " + RefusalText(s.error()));
      return HtmlResponse(
          400, RenderPage(r.Frame("Today", "today"), TodayBody(r, notice, at, RefusalText(s.error()), probes)));
    }
    const SendingRecord& v = s.value();
    landed += (landed.empty() ? "" : " ") + std::string("Marked ") + v.probe_ref + " as sent at " + v.sent_at +
              (v.previous_sent_at.empty()
                   ? ""
                   : "; this replaces the earlier sending time " + v.previous_sent_at + ", which is kept") +
              ".";
  }
  return TodayPage(r, NoticeBox("ok", landed));
}

}  // namespace twinprobe
