// `twinprobe review`: the queue of logged mail with its evidence, and a
// person's decision on one message (confirm, change the code, assign a
// probe, dismiss). Never prompts: it runs the same in a terminal and a script.
#include <iostream>
#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "collector/declines.h"
#include "collector/mail_review.h"
#include "core/clock.h"
#include "core/ethics_gate.h"
#include "core/terminal_text.h"

namespace twinprobe {
namespace {

struct ReviewOptions {
  std::string message;
  bool confirm = false, dismiss = false, all = false;
  std::string code, probe, at;
};

nlohmann::json NullIfEmpty(const std::string& s) { return s.empty() ? nlohmann::json(nullptr) : nlohmann::json(s); }

// The stored spelling, or null while the message waits.
nlohmann::json DecisionJson(const std::optional<ReviewDecision>& decision) {
  return decision ? nlohmann::json(std::string(ReviewDecisionName(*decision))) : nlohmann::json(nullptr);
}

nlohmann::json ItemJson(const ReviewItem& i) {
  nlohmann::json evidence = nlohmann::json::array();
  for (const auto& e : i.evidence)
    evidence.push_back({{"code", e.code},
                        {"phrase", e.phrase},
                        {"where", e.where},
                        {"negated", e.negated},
                        {"context", NullIfEmpty(e.context)}});
  return {{"message", i.message},
          {"status", i.status},
          {"date", NullIfEmpty(i.date)},
          {"date_source", NullIfEmpty(i.date_source)},
          {"source", i.source},
          {"where", NullIfEmpty(i.where)},
          {"probe", NullIfEmpty(i.probe_ref)},
          {"profile", NullIfEmpty(i.profile)},
          {"employer", NullIfEmpty(i.employer_key)},
          {"from", NullIfEmpty(i.from)},
          {"subject", NullIfEmpty(i.subject)},
          {"excerpt", NullIfEmpty(i.excerpt)},
          {"purged", i.purged},
          {"reason", i.reason},
          {"candidates", i.candidates},
          {"suggested_code", NullIfEmpty(i.suggested_code)},
          {"evidence", evidence},
          {"decision", DecisionJson(i.decision)},
          {"decided_by", NullIfEmpty(i.decided_by)},
          {"decided_at", NullIfEmpty(i.decided_at)},
          {"response_id", i.response_id ? nlohmann::json(i.response_id) : nlohmann::json(nullptr)}};
}

void PrintItem(const ReviewItem& i) {
  const std::string n = std::to_string(i.message);
  std::cout << "message " << n << "  " << i.status;
  if (!i.probe_ref.empty()) std::cout << " -> " << ForTerminal(i.probe_ref);
  std::cout << ", suggested: " << (i.suggested_code.empty() ? "(none)" : i.suggested_code) << "\n";
  auto row = [](const char* label, const std::string& value) {
    // Subjects, senders and excerpts come from the mail: shown escaped.
    if (!value.empty())
      std::cout << "  " << label << std::string(10 - std::string(label).size(), ' ') << ForTerminal(value) << "\n";
  };
  row("date", i.date.empty()                 ? "(none in the message)"
              : i.date_source == "forwarded" ? i.date + " (the forwarded message's date)"
              : i.date_source == "envelope"  ? i.date + " (from the mailbox, the message has no Date)"
                                             : i.date);
  row("source", i.where.empty() ? i.source : i.where);
  row("profile", i.profile.empty() ? "(no profile's mailbox found)" : i.profile);
  row("employer", i.employer_key);
  if (i.purged) row("text", "(purged: sender, subject and excerpt were removed)");
  row("from", i.from);
  row("subject", i.subject);
  row("match", i.reason);
  bool first = true;
  for (const auto& e : i.evidence) {
    std::string line = e.code + ": \"" + e.phrase + "\" in the " + e.where + (e.negated ? " (set aside: negated)" : "");
    if (!e.context.empty()) line += " \u2014 " + e.context;
    row(first ? "evidence" : "", line);
    first = false;
  }
  if (i.evidence.empty()) row("evidence", "no phrase of the rules appears");
  row("excerpt", i.excerpt);
  if (i.decision) {
    row("decision", std::string(ReviewDecisionName(*i.decision)) + " by " + i.decided_by + " at " + i.decided_at +
                        (i.response_id ? " (response " + std::to_string(i.response_id) + ")" : ""));
  } else if (i.probe_ref.empty()) {
    row("decide", i.suggested_code.empty()
                      ? "twinprobe review " + n + " --probe PROBE --code CODE   (or --dismiss)"
                      : "twinprobe review " + n + " --probe PROBE --confirm   (or --code CODE, --dismiss)");
  } else {
    row("decide", i.suggested_code.empty()
                      ? "twinprobe review " + n + " --code CODE   (or --probe PROBE, --dismiss)"
                      : "twinprobe review " + n + " --confirm   (or --code CODE, --probe PROBE, --dismiss)");
  }
}

Result<int64_t> MessageNumber(const std::string& text) {
  if (text.empty() || text.size() > 15 || text.find_first_not_of("0123456789") != std::string::npos)
    return Error{ErrorKind::kUsage, "", "'" + text + "' is not a message number",
                 "use the number 'twinprobe review' lists, e.g. 'twinprobe review 3 --confirm'"};
  return std::stoll(text);
}

int RunList(Context& ctx, Store& store, bool all) {
  auto queue = LoadReviewQueue(store, all);
  if (ctx.json) {
    nlohmann::json items = nlohmann::json::array();
    for (const auto& i : queue) items.push_back(ItemJson(i));
    std::cout << nlohmann::json{{"waiting", all ? nlohmann::json(nullptr) : nlohmann::json(queue.size())},
                                {"messages", items}}
                     .dump(2)
              << "\n";
    return 0;
  }
  if (queue.empty()) {
    std::cout << (all ? "No mail has been logged; run 'twinprobe mail' first.\n"
                      : "Nothing waits for review. ('twinprobe review --all' lists decided messages too.)\n");
    return 0;
  }
  size_t matched = 0;
  for (const auto& i : queue) matched += i.probe_ref.empty() ? 0 : 1;
  if (all)
    std::cout << queue.size() << " logged messages:\n\n";
  else
    std::cout << queue.size() << " message" << (queue.size() == 1 ? "" : "s") << " wait for review (" << matched
              << " matched to a probe, " << queue.size() - matched
              << " to assign). Nothing is recorded until you decide.\n\n";
  for (const auto& i : queue) {
    PrintItem(i);
    std::cout << "\n";
  }
  return 0;
}

int RunReview(Context& ctx, const ReviewOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  int actions = (o.confirm ? 1 : 0) + (o.dismiss ? 1 : 0) + (o.code.empty() ? 0 : 1);
  if (o.message.empty()) {
    if (actions || !o.probe.empty() || !o.at.empty())
      return ReportError(Error{ErrorKind::kUsage, "", "a decision needs the message number",
                               "write 'twinprobe review MESSAGE --confirm' (the numbers are in 'twinprobe review')"});
    return RunList(ctx, *store.value(), o.all);
  }
  auto number = MessageNumber(o.message);
  if (!number.ok()) return ReportError(number.error());
  if (actions > 1)
    return ReportError(
        Error{ErrorKind::kUsage, "", "--confirm, --code and --dismiss exclude one another", "give one of them"});
  if (actions == 0) {
    if (!o.probe.empty() || !o.at.empty())
      return ReportError(Error{ErrorKind::kUsage, "", "--probe and --at need a decision",
                               "add --confirm (the suggested code) or --code CODE"});
    auto item = LoadReviewItem(*store.value(), number.value());
    if (!item.ok()) return ReportError(item.error());
    if (ctx.json)
      std::cout << ItemJson(item.value()).dump(2) << "\n";
    else
      PrintItem(item.value());
    return 0;
  }
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  ReviewRequest req;
  req.message = number.value();
  req.action = o.dismiss ? ReviewAction::kDismiss : o.confirm ? ReviewAction::kConfirm : ReviewAction::kCode;
  req.code = o.code;
  req.probe_ref = o.probe;
  req.at = o.at;
  auto out = DecideReview(*store.value(), settings.value().outcomes, req);
  if (!out.ok()) return ReportError(out.error());
  const ReviewOutcome& r = out.value();
  // The same warnings and the same decline reminder as `record` gives.
  for (const auto& w : r.warnings) Warn(w);
  if (r.late)
    Warn("the response came " + std::to_string(r.days_after_sending) + " days after " + r.probe_ref +
         " was sent, outside the observation window of " + std::to_string(settings.value().outcomes.window_days) +
         " days; it is stored with the flag 'late'");
  const EthicsBlock& ethics = settings.value().ethics;
  std::string decline_by;
  if (r.positive && ethics.decline_within_hours > 0)
    decline_by = FormatIsoTime(DeclineDeadline(ethics, ParseIsoTime(r.received_at).value_or(0)));
  if (ctx.json) {
    std::cout << nlohmann::json{{"message", req.message},
                                {"decision", std::string(ReviewDecisionName(r.decision))},
                                {"response_id",
                                 r.response_id ? nlohmann::json(r.response_id) : nlohmann::json(nullptr)},
                                {"probe", NullIfEmpty(r.probe_ref)},
                                {"code", NullIfEmpty(r.code)},
                                {"received_at", NullIfEmpty(r.received_at)},
                                {"positive", r.positive},
                                {"late", r.late},
                                {"decline_by", NullIfEmpty(decline_by)},
                                {"supersedes", r.superseded ? nlohmann::json(r.superseded) : nlohmann::json(nullptr)},
                                {"warnings", r.warnings},
                                {"audit_hash", r.audit_hash}}
                     .dump(2)
              << "\n";
    return 0;
  }
  if (r.decision == ReviewDecision::kDismissed) {
    std::cout << "Dismissed message " << req.message << "; no response was recorded.\n";
    return 0;
  }
  std::cout << "Recorded " << r.code << " for " << r.probe_ref << " at " << r.received_at << " from message "
            << req.message << " (" << ReviewDecisionName(r.decision)
            << (r.decision == ReviewDecision::kConfirmed ? " as suggested" : " by you") << ")"
            << (r.positive ? ", a positive callback" : "");
  if (r.superseded) std::cout << "; it supersedes response " << r.superseded << ", which is kept";
  std::cout << ".\n";
  if (!decline_by.empty())
    std::cout << DeclineReminder(r.code, r.probe_ref, *ParseIsoTime(decline_by), ethics.decline_within_hours,
                                 "run '" + CommandFor(ctx, "decline " + r.probe_ref) + "'",
                                   StudyPath(ctx, kDeclineLetterPath))
              << "\n";
  return 0;
}

}  // namespace

void RegisterReviewCommand(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<ReviewOptions>();
  auto* review = app.add_subcommand(
      "review", "List logged mail with its evidence, or decide on one message: confirm, change, assign or dismiss");
  review->add_option("message", o->message, "Message number from the list; without it, list the queue");
  review->add_flag("--confirm", o->confirm, "Record the suggested code for the matched (or --probe) probe");
  review->add_option("--code", o->code, "Record this code instead of the suggestion");
  review->add_option("--probe", o->probe, "Assign the message to this probe (e.g. P00012)");
  review->add_option("--at", o->at, "When the response arrived (YYYY-MM-DD[THH:MM], UTC); default: the message's date");
  review->add_flag("--dismiss", o->dismiss, "Not a response to any probe: log the decision, record nothing");
  review->add_flag("--all", o->all, "List decided messages too");
  review->callback([&ctx, o] { ctx.exit_code = RunReview(ctx, *o); });
}

}  // namespace twinprobe
