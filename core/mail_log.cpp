#include "core/mail_log.h"

#include "core/sha256.h"

namespace twinprobe {
namespace {

void BindOptional(Stmt& s, int index, const std::optional<std::string>& value) {
  if (value)
    s.Bind(index, *value);
  else
    s.BindNull(index);
}

}  // namespace

MailLog::MailLog(Store& store)
    : store_(store),
      find_(store.Prepare("SELECT id FROM mail_message WHERE message_id = ?1")),
      insert_(store.Prepare(
          "INSERT INTO mail_message(message_id, mailbox, from_addr, to_addr, subject, sent_date, body_sha256, "
          "excerpt, probe_id, match_reason, suggested_code, evidence, audit_seq) "
          "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13)")),
      seal_(store.Prepare(
          "INSERT INTO mail_excerpt_seal(mail_message_id, excerpt_sha256, audit_seq) VALUES (?1, ?2, ?3)")) {}

std::optional<int64_t> MailLog::Find(const std::string& key) {
  find_.Bind(1, key);
  std::optional<int64_t> id;
  if (find_.Step()) id = find_.Int(0);
  find_.Reset();
  return id;
}

int64_t MailLog::Insert(int64_t seq, const MailMessageRow& row) {
  insert_.Bind(1, row.key).Bind(2, row.source);
  BindOptional(insert_, 3, row.from_digest);
  BindOptional(insert_, 4, row.profile_mailbox);
  BindOptional(insert_, 5, row.subject_digest);
  BindOptional(insert_, 6, row.sent_date);
  insert_.Bind(7, row.body_sha256).Bind(8, row.excerpt);
  if (row.probe_id)
    insert_.Bind(9, *row.probe_id);
  else
    insert_.BindNull(9);
  insert_.Bind(10, row.match_reason);
  BindOptional(insert_, 11, row.suggested_code);
  insert_.Bind(12, row.evidence).Bind(13, seq).Run();
  const int64_t id = store_.LastInsertId();
  // The excerpt is left out of the row's digest (purge clears it); its
  // SHA-256 is sealed beside it instead (schema version 13).
  seal_.Bind(1, id).Bind(2, Sha256Hex(row.excerpt)).Bind(3, seq).Run();
  return id;
}

std::vector<MailProbeRow> ReadMailProbes(Store& store) {
  Stmt s = store.Prepare(
      "SELECT p.id, p.ref, lower(coalesce(pr.mailbox, '')), v.ref, coalesce(v.employer_key, ''), "
      "coalesce(e.name, ''), lower(coalesce(e.contact, '')) "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id "
      "LEFT JOIN profile pr ON pr.id = p.profile_id LEFT JOIN employer e ON e.key = v.employer_key ORDER BY p.id");
  std::vector<MailProbeRow> out;
  while (s.Step()) out.push_back({s.Int(0), s.Text(1), s.Text(2), s.Text(3), s.Text(4), s.Text(5), s.Text(6)});
  return out;
}

std::optional<std::string> ReadProbeMailbox(Store& store, const std::string& probe_ref) {
  Stmt who = store.Prepare(
      "SELECT lower(coalesce(pr.mailbox, '')) FROM current_probe p LEFT JOIN profile pr ON pr.id = p.profile_id "
      "WHERE p.ref = ?1");
  who.Bind(1, probe_ref);
  if (!who.Step()) return std::nullopt;
  return who.Text(0);
}

}  // namespace twinprobe
