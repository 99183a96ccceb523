// Declines: every positive response not yet declined, overdue first, with
// the letter to use and a "declined at" form (as `decline`).
#include <algorithm>

#include "collector/declines.h"
#include "collector/responses.h"
#include "core/clock.h"
#include "core/desk_actor.h"
#include "desk/routes.h"
#include "report/html_escape.h"

namespace twinprobe {

namespace {

// The deadline in the words every command uses, as a sentence.
std::string DeclineSentenceStart(const PendingDecline& d, int hours) {
  std::string words = DeclineDeadlineWords(d.code, d.probe_ref, d.deadline, hours);
  words[0] = 'D';
  return words;
}

}  // namespace

DeskResponse DeclinesPage(const PageRequest& r, const std::string& notice_html, const std::string& refused_probe,
                          const std::string& refusal) {
  std::string body = notice_html;
  const int hours = r.design.ethics.decline_within_hours;
  if (hours <= 0) {
    body +=
        "<p class=\"absent\">The design sets no decline deadline ([ethics] decline_within_hours), so nothing is "
        "listed here.</p>";
    return HtmlResponse(200, RenderPage(r.Frame("Declines", "declines"), body));
  }
  auto pending = PendingDeclines(r.store, r.design.outcomes, hours, NowEpoch());
  body += "<p>Every invitation or offer holds a real vacancy for an applicant who does not exist. Decline it within " +
          std::to_string(hours) +
          " hours of receipt with the letter in <code>ethics/letters/decline-invitation.md</code>, then record here "
          "when you did.</p>";
  if (pending.empty()) body += "<p class=\"absent\">Nothing to decline.</p>";
  if (!refusal.empty() && std::none_of(pending.begin(), pending.end(),
                                       [&](const PendingDecline& d) { return d.probe_ref == refused_probe; }))
    body += NoticeBox("error", refusal);
  for (const PendingDecline& d : pending) {
    const std::string id = "declined_at-" + d.probe_ref;
    body += "<section class=\"decline\"><h2>" + UserText(d.probe_ref) + " " +
            (d.overdue ? "<span class=\"tag overdue\">overdue</span>" : "<span class=\"tag\">due</span>") +
            "</h2><p>" + EscapeHtml(DeclineSentenceStart(d, hours)) +
            ".</p><dl class=\"facts\"><dt>Decline by</dt><dd>" + EscapeHtml(FormatIsoTime(d.deadline)) +
            "</dd><dt>Response</dt><dd>" + UserText(d.code) + ", received " + EscapeHtml(d.received_at) +
            "</dd><dt>Vacancy</dt><dd>" + UserText(d.vacancy_ref) + " (" + UserText(d.employer_key) +
            ")</dd><dt>Profile</dt><dd>" + UserText(d.profile) + "</dd></dl>";
    body += "<form method=\"post\" action=\"/declines\" class=\"row\">" + CsrfInput(r.session.csrf) +
            "<input type=\"hidden\" name=\"probe\" value=\"" + EscapeHtml(d.probe_ref) + "\">" +
            InputField({id, "Declined at (UTC)", d.probe_ref == refused_probe ? r.Param(id) : "",
                        "YYYY-MM-DD or YYYY-MM-DDTHH:MM; leave empty for now",
                        d.probe_ref == refused_probe ? refusal : "", "text", "off", false}) +
            SelectField({"channel-" + d.probe_ref, "Channel", "", "", "", "text", "off", false}, ResponseChannels(),
                        "not known") +
            "<div class=\"field action\"><button type=\"submit\">Declined</button></div></form></section>";
  }
  return HtmlResponse(refusal.empty() ? 200 : 400, RenderPage(r.Frame("Declines", "declines"), body));
}

DeskResponse DeclineEntry(const PageRequest& r) {
  const std::string probe = r.Param("probe");
  DeskActorScope actor(r.session.member);
  auto d =
      RecordDecline(r.store, r.design.outcomes, probe, r.Param("declined_at-" + probe), r.Param("channel-" + probe));
  if (!d.ok()) return DeclinesPage(r, "", probe, RefusalText(d.error()));
  return DeclinesPage(r, NoticeBox("ok", DeclineSentence(d.value())));
}

}  // namespace twinprobe
