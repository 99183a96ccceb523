#include "core/mail_reviews.h"

namespace twinprobe {
namespace {

const char* kSelect =
    "SELECT m.id, m.mailbox, coalesce(m.sent_date, ''), coalesce(p.ref, ''), coalesce(m.to_addr, ''), "
    "coalesce(v.employer_key, ''), coalesce(m.match_reason, ''), coalesce(m.suggested_code, ''), "
    "coalesce(m.evidence, '{}'), m.excerpt, coalesce(d.decision, ''), coalesce(d.decided_by, ''), "
    "coalesce(d.decided_at, ''), coalesce(d.response_id, 0) "
    "FROM mail_message m LEFT JOIN probe p ON p.id = m.probe_id LEFT JOIN vacancy v ON v.id = p.vacancy_id "
    "LEFT JOIN review_decision d ON d.mail_message_id = m.id ";

MailReviewRow ReadRow(const Stmt& s) {
  MailReviewRow r;
  r.message = s.Int(0);
  r.source = s.Text(1);
  r.date = s.Text(2);
  r.probe_ref = s.Text(3);
  r.profile = s.Text(4);
  r.employer_key = s.Text(5);
  r.match_reason = s.Text(6);
  r.suggested_code = s.Text(7);
  r.evidence_json = s.Text(8);
  r.excerpt_json = s.OptText(9);
  if (std::string decision = s.Text(10); !decision.empty()) {
    r.decision = ParseReviewDecision(decision);
    // Only a newer twinprobe (or a hand edit) writes another spelling.
    if (!r.decision)
      throw StoreError("review_decision of mail message " + std::to_string(r.message) + " holds unknown decision '" +
                       decision + "'");
  }
  r.decided_by = s.Text(11);
  r.decided_at = s.Text(12);
  r.response_id = s.Int(13);
  return r;
}

}  // namespace

std::vector<MailReviewRow> ReadMailReviews(Store& store, bool include_decided) {
  std::vector<MailReviewRow> out;
  Stmt s = store.Prepare(std::string(kSelect) + (include_decided ? "" : "WHERE d.id IS NULL ") + "ORDER BY m.id");
  while (s.Step()) out.push_back(ReadRow(s));
  return out;
}

std::optional<MailReviewRow> ReadMailReview(Store& store, int64_t message) {
  Stmt s = store.Prepare(std::string(kSelect) + "WHERE m.id = ?1");
  s.Bind(1, message);
  if (!s.Step()) return std::nullopt;
  return ReadRow(s);
}

void InsertReviewDecision(Store& store, int64_t seq, int64_t message, ReviewDecision decision,
                          std::optional<int64_t> response_id, const std::string& decided_by,
                          const std::string& decided_at) {
  Stmt ins = store.Prepare(
      "INSERT INTO review_decision(mail_message_id, decision, response_id, decided_by, decided_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins.Bind(1, message).Bind(2, ReviewDecisionName(decision));
  if (response_id)
    ins.Bind(3, *response_id);
  else
    ins.BindNull(3);
  ins.Bind(4, decided_by).Bind(5, decided_at).Bind(6, seq).Run();
}

}  // namespace twinprobe
