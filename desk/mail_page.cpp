// Mail: the review queue with its evidence, and a decision per message
// (confirm the suggestion, record another code, or dismiss), through the
// same function as `review`, with its messages.
#include <charconv>

#include "collector/declines.h"
#include "collector/mail_review.h"
#include "core/clock.h"
#include "core/desk_actor.h"
#include "core/ethics_gate.h"
#include "desk/routes.h"
#include "report/html_escape.h"

namespace twinprobe {
namespace {

struct Refusal {
  int64_t message = 0;
  std::string text;
};

std::string Evidence(const ReviewItem& i) {
  if (i.evidence.empty()) return "<p class=\"absent\">No suggestion rule matched a phrase.</p>";
  std::string h = "<ul>";
  for (const PhraseEvidence& e : i.evidence)
    h += "<li>" + UserText(e.code) + ": \u201c" + UserText(e.phrase) + "\u201d in the " + UserText(e.where) +
         (e.negated ? " <span class=\"tag\">set aside: negated</span>" : "") +
         (e.context.empty() ? "" : "<div class=\"pre note\">" + UserText(e.context) + "</div>") + "</li>";
  return h + "</ul>";
}

std::string ItemSection(const PageRequest& r, const ReviewItem& i, const Refusal& refusal) {
  const std::string n = std::to_string(i.message);
  const bool refused = refusal.message == i.message;
  std::string h =
      "<section class=\"mail\"><h2>Message " + n + " <span class=\"tag\">" + UserText(i.status) +
      "</span></h2><dl class=\"facts\"><dt>From</dt><dd>" + UserText(i.from) + "</dd><dt>Subject</dt><dd>" +
      UserText(i.subject) + "</dd><dt>Date</dt><dd>" + EscapeHtml(i.date.empty() ? "none" : i.date) +
      "</dd><dt>Probe</dt><dd>" +
      (i.probe_ref.empty() ? "<span class=\"absent\">not matched</span>"
                           : "<a href=\"/probe?id=" + UrlEncode(i.probe_ref) + "\">" + UserText(i.probe_ref) + "</a>") +
      "</dd><dt>Why</dt><dd>" + UserText(i.reason) + "</dd>";
  if (!i.candidates.empty()) {
    h += "<dt>Candidates</dt><dd>";
    for (size_t k = 0; k < i.candidates.size(); ++k) h += (k ? ", " : "") + UserText(i.candidates[k]);
    h += "</dd>";
  }
  h += "<dt>Suggested</dt><dd>" +
       (i.suggested_code.empty() ? "<span class=\"absent\">nothing</span>" : UserText(i.suggested_code)) +
       "</dd></dl><h3>Evidence</h3>" + Evidence(i);
  if (i.purged)
    h += "<p class=\"absent\">The text was removed by purge.</p>";
  else if (!i.excerpt.empty())
    h += "<h3>Excerpt</h3><div class=\"pre note\">" + UserText(i.excerpt) + "</div>";

  std::vector<std::string> decisions = {"code", "dismiss"};
  if (!i.suggested_code.empty()) decisions.insert(decisions.begin(), "confirm");
  const std::string chosen = refused ? r.Param("decision-" + n) : "";
  h +=
      "<form method=\"post\" action=\"/mail\">" + CsrfInput(r.session.csrf) +
      "<input type=\"hidden\" name=\"message\" value=\"" + n + "\"><div class=\"row\">" +
      SelectField({"decision-" + n, "Decision", chosen,
                   "confirm: the suggested code; code: the one you choose; dismiss: nothing",
                   refused ? refusal.text : "", "text", "off", true},
                  decisions, "Choose") +
      SelectField({"code-" + n, "Code (for 'code')", refused ? r.Param("code-" + n) : "", "", "", "text", "off", false},
                  r.design.outcomes.codes, "none chosen") +
      InputField({"probe-" + n, "Probe", refused ? r.Param("probe-" + n) : i.probe_ref,
                  "assigns the message to this probe", "", "text", "off", false}) +
      InputField({"at-" + n, "Received at (UTC)", refused ? r.Param("at-" + n) : "",
                  "leave empty for the message's date", "", "text", "off", false}) +
      "<div class=\"field action\"><button type=\"submit\">Decide</button></div></div></form></section>";
  return h;
}

DeskResponse Page(const PageRequest& r, int status, const std::string& notice, const Refusal& refusal) {
  std::string body = notice;
  auto queue = LoadReviewQueue(r.store, false);
  if (queue.empty())
    body +=
        "<p class=\"absent\">No message waits for review. Mail is read into the store with <code>twinprobe "
        "mail</code>.</p>";
  else
    body += "<p>" + std::to_string(queue.size()) + (queue.size() == 1 ? " message waits" : " messages wait") +
            " for a decision, oldest first. Read the evidence before confirming a suggestion.</p>";
  bool shown = false;
  for (const ReviewItem& i : queue) {
    body += ItemSection(r, i, refusal);
    shown |= i.message == refusal.message;
  }
  if (!refusal.text.empty() && !shown) body += NoticeBox("error", refusal.text);
  return HtmlResponse(status, RenderPage(r.Frame("Mail", "mail"), body));
}

}  // namespace

DeskResponse MailPage(const PageRequest& r) { return Page(r, 200, "", {}); }

DeskResponse MailDecision(const PageRequest& r) {
  const std::string n = r.Param("message");
  int64_t message = 0;
  auto [end, ec] = std::from_chars(n.data(), n.data() + n.size(), message);
  if (ec != std::errc() || end != n.data() + n.size() || message <= 0)
    return Page(r, 400, NoticeBox("error", "No such message; nothing was recorded."), {});
  const std::string decision = r.Param("decision-" + n);
  ReviewRequest req;
  req.message = message;
  req.action = decision == "confirm"   ? ReviewAction::kConfirm
               : decision == "dismiss" ? ReviewAction::kDismiss
                                       : ReviewAction::kCode;
  req.code = r.Param("code-" + n);
  req.probe_ref = r.Param("probe-" + n);
  req.at = r.Param("at-" + n);
  if (decision != "confirm" && decision != "code" && decision != "dismiss")
    return Page(r, 400, "", {message, "choose a decision \u2014 confirm, code or dismiss"});
  if (req.action == ReviewAction::kDismiss) {
    // A dismissal assigns nothing and has no time; the probe field only
    // showed the match.
    req.probe_ref.clear();
    req.at.clear();
  } else if (req.action == ReviewAction::kConfirm) {
    req.code.clear();
  }
  DeskActorScope actor(r.session.member);
  auto out = DecideReview(r.store, r.design.outcomes, req);
  if (!out.ok()) return Page(r, 400, "", {message, RefusalText(out.error())});
  const ReviewOutcome& o = out.value();
  if (o.decision == ReviewDecision::kDismissed)
    return Page(r, 200, NoticeBox("ok", "Dismissed message " + n + "; no response was recorded."), {});
  // The same sentences as `review`.
  std::string text = "Recorded " + o.code + " for " + o.probe_ref + " at " + o.received_at + " from message " + n +
                     " (" + std::string(ReviewDecisionName(o.decision)) +
                     (o.decision == ReviewDecision::kConfirmed ? " as suggested" : " by you") + ")" +
                     (o.positive ? ", a positive callback" : "");
  if (o.superseded) text += "; it supersedes response " + std::to_string(o.superseded) + ", which is kept";
  std::string notice = NoticeBox("ok", text + ".");
  for (const auto& w : o.warnings) notice += NoticeBox("error", w);
  const EthicsBlock& ethics = r.design.ethics;
  if (o.positive && ethics.decline_within_hours > 0)
    notice += NoticeBox("error", DeclineReminder(o.code, o.probe_ref,
                                                 DeclineDeadline(ethics, ParseIsoTime(o.received_at).value_or(0)),
                                                 ethics.decline_within_hours, "mark it on the Declines page"));
  return Page(r, 200, notice, {});
}

}  // namespace twinprobe
