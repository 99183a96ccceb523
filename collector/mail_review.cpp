#include "collector/mail_review.h"

#include <nlohmann/json.hpp>

#include "collector/responses.h"
#include "core/audit.h"

namespace twinprobe {
namespace {

const char* kSelect =
    "SELECT m.id, m.mailbox, coalesce(m.sent_date, ''), coalesce(p.ref, ''), coalesce(m.to_addr, ''), "
    "coalesce(v.employer_key, ''), coalesce(m.match_reason, ''), coalesce(m.suggested_code, ''), "
    "coalesce(m.evidence, '{}'), m.excerpt, coalesce(d.decision, ''), coalesce(d.decided_by, ''), "
    "coalesce(d.decided_at, ''), coalesce(d.response_id, 0) "
    "FROM mail_message m LEFT JOIN probe p ON p.id = m.probe_id LEFT JOIN vacancy v ON v.id = p.vacancy_id "
    "LEFT JOIN review_decision d ON d.mail_message_id = m.id ";

std::string Str(const nlohmann::json& j, const char* key) {
  auto it = j.find(key);
  return it != j.end() && it->is_string() ? it->get<std::string>() : "";
}

ReviewItem ReadItem(const Stmt& s) {
  ReviewItem item;
  item.message = s.Int(0);
  item.source = s.Text(1);
  item.date = s.Text(2);
  item.probe_ref = s.Text(3);
  item.profile = s.Text(4);
  item.employer_key = s.Text(5);
  item.reason = s.Text(6);
  if (size_t colon = item.reason.find(": "); colon != std::string::npos) item.reason = item.reason.substr(colon + 2);
  item.suggested_code = s.Text(7);
  item.decision = s.Text(10);
  item.decided_by = s.Text(11);
  item.decided_at = s.Text(12);
  item.response_id = s.Int(13);
  if (item.probe_ref.empty()) item.employer_key.clear();

  nlohmann::json evidence = nlohmann::json::parse(s.Text(8), nullptr, false);
  if (evidence.is_discarded()) evidence = nlohmann::json::object();
  item.status = Str(evidence, "match");
  item.date_source = Str(evidence, "date");
  if (item.status.empty()) item.status = item.probe_ref.empty() ? "unmatched" : "matched";
  if (evidence.contains("candidates") && evidence["candidates"].is_array())
    for (const auto& c : evidence["candidates"])
      if (c.is_string()) item.candidates.push_back(c.get<std::string>());

  nlohmann::json excerpt = s.IsNull(9) ? nlohmann::json() : nlohmann::json::parse(s.Text(9), nullptr, false);
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
  Stmt s = store.Prepare(std::string(kSelect) + (include_decided ? "" : "WHERE d.id IS NULL ") + "ORDER BY m.id");
  while (s.Step()) out.push_back(ReadItem(s));
  return out;
}

Result<ReviewItem> LoadReviewItem(Store& store, int64_t message) {
  Stmt s = store.Prepare(std::string(kSelect) + "WHERE m.id = ?1");
  s.Bind(1, message);
  if (!s.Step())
    return BadInput("", "there is no mail message " + Number(message), "run 'twinprobe review' to list the queue");
  return ReadItem(s);
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
  if (!item.decision.empty())
    return BadInput("",
                    "message " + n + " was reviewed before (" + item.decision + " by " + item.decided_by + " at " +
                        item.decided_at + ")",
                    "to correct the response, record a new one with 'twinprobe record PROBE CODE'; it supersedes the "
                    "old one and both are kept");
  Stmt ins = store.Prepare(
      "INSERT INTO review_decision(mail_message_id, decision, response_id, decided_by, decided_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");

  if (req.action == ReviewAction::kDismiss) {
    if (!req.probe_ref.empty() || !req.at.empty())
      return BadInput("", "--probe and --at do not go with --dismiss", "dismiss the message alone, or confirm it");
    out.decision = "dismissed";
    ins.Bind(1, req.message).Bind(2, out.decision).BindNull(3).Bind(4, write.actor()).Bind(5, write.at());
    ins.Bind(6, write.seq()).Run();
    out.audit_hash = write.Commit("review message " + n + ": dismissed (no response recorded)");
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
  auto recorded = AddResponse(store, scheme, entry, write.seq(), write.actor(), write.at(), "");
  if (!recorded.ok()) return recorded.error();
  out.response_id = recorded.value().response_id;
  out.received_at = recorded.value().received_at;
  out.positive = recorded.value().positive;
  out.late = recorded.value().late;
  out.unsent = recorded.value().unsent;
  out.days_after_sending = recorded.value().days_after_sending;
  out.superseded = recorded.value().superseded;
  out.decision = out.probe_ref == item.probe_ref && out.code == item.suggested_code ? "confirmed" : "changed";

  // A probe of another profile than the one the message was for is allowed
  // (a forwarded message may say so), but worth a second look.
  if (!item.profile.empty()) {
    Stmt who = store.Prepare(
        "SELECT lower(coalesce(pr.mailbox, '')) FROM current_probe p LEFT JOIN profile pr ON pr.id = p.profile_id "
        "WHERE p.ref = ?1");
    who.Bind(1, out.probe_ref);
    if (who.Step() && item.profile.find(who.Text(0)) == std::string::npos)
      out.warnings.push_back(out.probe_ref + " belongs to profile " + who.Text(0) + ", but the message was for " +
                             item.profile);
  }
  ins.Bind(1, req.message).Bind(2, out.decision).Bind(3, out.response_id).Bind(4, write.actor()).Bind(5, write.at());
  ins.Bind(6, write.seq()).Run();
  out.audit_hash =
      write.Commit("review message " + n + ": " + out.decision + " " + out.code + " for " + out.probe_ref +
                   (out.superseded ? " (supersedes response " + std::to_string(out.superseded) + ")" : ""));
  return out;
}

}  // namespace twinprobe
