#include "collector/mail_review.h"

#include <nlohmann/json.hpp>

#include "collector/responses.h"
#include "core/audit.h"
#include "core/audit_summaries.h"
#include "core/mail_log.h"
#include "core/mail_reviews.h"
#include "core/sending_records.h"

namespace twinprobe {
namespace {

std::string Str(const nlohmann::json& j, const char* key) {
  auto it = j.find(key);
  return it != j.end() && it->is_string() ? it->get<std::string>() : "";
}

ReviewItem ReadItem(const MailReviewRow& row) {
  ReviewItem item;
  item.message = row.message;
  item.source = row.source;
  item.date = row.date;
  item.probe_ref = row.probe_ref;
  item.profile = row.profile;
  item.employer_key = row.employer_key;
  item.reason = row.match_reason;
  if (size_t colon = item.reason.find(": "); colon != std::string::npos) item.reason = item.reason.substr(colon + 2);
  item.suggested_code = row.suggested_code;
  item.decision = row.decision;
  item.decided_by = row.decided_by;
  item.decided_at = row.decided_at;
  item.response_id = row.response_id;
  if (item.probe_ref.empty()) item.employer_key.clear();

  nlohmann::json evidence = nlohmann::json::parse(row.evidence_json, nullptr, false);
  if (evidence.is_discarded()) evidence = nlohmann::json::object();
  item.status = Str(evidence, "match");
  item.date_source = Str(evidence, "date");
  if (item.status.empty()) item.status = item.probe_ref.empty() ? "unmatched" : "matched";
  if (evidence.contains("candidates") && evidence["candidates"].is_array())
    for (const auto& c : evidence["candidates"])
      if (c.is_string()) item.candidates.push_back(c.get<std::string>());

  nlohmann::json excerpt =
      !row.excerpt_json ? nlohmann::json() : nlohmann::json::parse(*row.excerpt_json, nullptr, false);
  item.purged = !excerpt.is_object();
  if (!item.purged) {
    item.from = Str(excerpt, "from");
    item.subject = Str(excerpt, "subject");
    item.excerpt = Str(excerpt, "text");
    item.where = Str(excerpt, "where");
  }
  if (evidence.contains("phrases") && evidence["phrases"].is_array()) {
    size_t k = 0;
    for (const auto& p : evidence["phrases"]) {
      PhraseEvidence e;
      e.code = Str(p, "code");
      e.phrase = Str(p, "phrase");
      e.where = Str(p, "where");
      e.negated = p.value("negated", false);
      if (!item.purged && excerpt.contains("contexts") && excerpt["contexts"].is_array() &&
          k < excerpt["contexts"].size() && excerpt["contexts"][k].is_string())
        e.context = excerpt["contexts"][k].get<std::string>();
      item.evidence.push_back(e);
      ++k;
    }
  }
  return item;
}

std::string Number(int64_t message) { return std::to_string(message); }

}  // namespace

std::vector<ReviewItem> LoadReviewQueue(Store& store, bool include_decided) {
  std::vector<ReviewItem> out;
  for (const MailReviewRow& row : ReadMailReviews(store, include_decided)) out.push_back(ReadItem(row));
  return out;
}

Result<ReviewItem> LoadReviewItem(Store& store, int64_t message) {
  std::optional<MailReviewRow> row = ReadMailReview(store, message);
  if (!row)
    return BadInput("", "there is no mail message " + Number(message), "run 'twinprobe review' to list the queue");
  return ReadItem(*row);
}

Result<ReviewOutcome> DecideReview(Store& store, const OutcomeScheme& scheme, const ReviewRequest& req) {
  // The write lock is taken first, so two people deciding at once queue up
  // and the second sees the first one's decision.
  AuditedWrite write(store, "review");
  auto loaded = LoadReviewItem(store, req.message);
  if (!loaded.ok()) return loaded.error();
  ReviewOutcome out;
  out.item = loaded.value();
  const ReviewItem& item = out.item;
  const std::string n = Number(req.message);
  if (item.decision)
    return BadInput("",
                    "message " + n + " was reviewed before (" + std::string(ReviewDecisionName(*item.decision)) +
                        " by " + item.decided_by + " at " + item.decided_at + ")",
                    "to correct the response, record a new one with 'twinprobe record PROBE CODE'; it supersedes the "
                    "old one and both are kept");
  if (req.action == ReviewAction::kDismiss) {
    if (!req.probe_ref.empty() || !req.at.empty())
      return BadInput("", "--probe and --at do not go with --dismiss", "dismiss the message alone, or confirm it");
    out.decision = ReviewDecision::kDismissed;
    InsertReviewDecision(store, write.seq(), req.message, out.decision, std::nullopt, write.actor(), write.at());
    out.audit_hash = write.Commit(ReviewDismissedSummary(req.message));
    return out;
  }

  out.probe_ref = req.probe_ref.empty() ? item.probe_ref : req.probe_ref;
  if (out.probe_ref.empty())
    return BadInput("", "message " + n + " is not matched to one probe (" + item.status + ")",
                    "assign it: 'twinprobe review " + n + " --probe P00012 --code CODE' (or --confirm)");
  out.code = req.action == ReviewAction::kCode ? req.code : item.suggested_code;
  if (out.code.empty())
    return BadInput("", "no code was suggested for message " + n, "give one: 'twinprobe review " + n + " --code CODE'");
  std::string at = req.at.empty() ? item.date : req.at;
  if (at.empty())
    return BadInput("", "message " + n + " carries no date", "give the time it arrived: --at YYYY-MM-DDTHH:MM");

  ResponseEntry entry;
  entry.probe_ref = out.probe_ref;
  entry.code = out.code;
  entry.received_at = at;
  entry.channel = "mail";
  entry.note = "mail message " + n;
  entry.origin = "mail-review";
  // A reply suggests the application left, but not when: recording it would
  // leave the window unmeasured, so the message stays in the queue until the
  // sending is recorded (the same rule as `record`).
  if (int64_t probe_id = FindProbe(store, out.probe_ref); probe_id != 0 && LastSentAt(store, probe_id).empty())
    return BadInput("",
                    "message " + n + " is matched to " + out.probe_ref +
                        ", which has no sending recorded, so it was not recorded as a response and stays in the queue",
                    "record the sending first with 'twinprobe sent " + out.probe_ref +
                        " --at TIME' (or 'twinprobe import sendings FILE.csv'), then review message " + n + " again");
  auto recorded = AddResponse(store, scheme, entry, write.seq(), write.actor(), write.at(), "");
  if (!recorded.ok()) return recorded.error();
  out.response_id = recorded.value().response_id;
  out.received_at = recorded.value().received_at;
  out.positive = recorded.value().positive;
  out.late = recorded.value().late;
  out.days_after_sending = recorded.value().days_after_sending;
  out.superseded = recorded.value().superseded;
  out.decision = out.probe_ref == item.probe_ref && out.code == item.suggested_code ? ReviewDecision::kConfirmed
                                                                                    : ReviewDecision::kChanged;

  // A probe of another profile than the one the message was for is allowed
  // (a forwarded message may say so), but worth a second look.
  if (!item.profile.empty()) {
    std::optional<std::string> mailbox = ReadProbeMailbox(store, out.probe_ref);
    if (mailbox && item.profile.find(*mailbox) == std::string::npos)
      out.warnings.push_back(out.probe_ref + " belongs to profile " + *mailbox + ", but the message was for " +
                             item.profile);
  }
  InsertReviewDecision(store, write.seq(), req.message, out.decision, out.response_id, write.actor(), write.at());
  out.audit_hash = write.Commit(
      ReviewRecordedSummary(req.message, ReviewDecisionName(out.decision), out.code, out.probe_ref, out.superseded));
  return out;
}

}  // namespace twinprobe
