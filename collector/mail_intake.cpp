#include "collector/mail_intake.h"

#include <nlohmann/json.hpp>
#include <set>

#include "collector/mail_match.h"
#include "collector/mail_message.h"
#include "collector/mail_suggest.h"
#include "collector/mail_text.h"
#include "core/audit.h"
#include "core/clock.h"
#include "core/sha256.h"

namespace twinprobe {
namespace {

std::string Trimmed(const std::string& s) {
  size_t a = s.find_first_not_of(" \t\r\n<");
  if (a == std::string::npos) return "";
  size_t b = s.find_last_not_of(" \t\r\n>");
  return s.substr(a, b - a + 1);
}

// "mbox:PATH", "maildir:DIR", or the (redacted) IMAP URL itself.
std::string SourceName(const MailBatch& b) { return b.kind == "imap" ? b.label : b.kind + ":" + b.label; }

std::string DigestOrNull(const std::string& value) { return value.empty() ? "" : "sha256:" + Sha256Hex(value); }

}  // namespace

std::string MailKey(const std::string& message_id, const std::string& raw) {
  std::string id = Trimmed(message_id);
  if (!id.empty()) return "mid:" + Sha256Hex(id);
  return "raw:" + Sha256Hex(CanonicalRaw(raw));
}

Result<IntakeSummary> IngestMail(Store& store, const MailRules& rules, const std::vector<MailBatch>& batches,
                                 const std::function<void(size_t, size_t)>& progress) {
  AuditedWrite write(store, "mail");
  IntakeSummary summary;
  const MatchIndex index = LoadMatchIndex(store);
  const Suggester suggester(rules);
  Stmt find = store.Prepare("SELECT id FROM mail_message WHERE message_id = ?1");
  Stmt ins = store.Prepare(
      "INSERT INTO mail_message(message_id, mailbox, from_addr, to_addr, subject, sent_date, body_sha256, excerpt, "
      "probe_id, match_reason, suggested_code, evidence, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13)");
  size_t total = 0;
  for (const MailBatch& batch : batches) total += batch.messages.size();
  for (const MailBatch& batch : batches) {
    for (const RawMail& raw : batch.messages) {
      ++summary.read;
      if (progress) progress(static_cast<size_t>(summary.read), total);
      const MailMessage m = ParseMailMessage(raw.raw);
      const std::string key = MailKey(m.message_id, raw.raw);
      IntakeMessage out;
      out.where = raw.where;
      out.subject = m.subject;
      find.Bind(1, key);
      if (find.Step()) {
        out.message = find.Int(0);
        out.status = "duplicate";
        find.Reset();
        ++summary.duplicates;
        summary.messages.push_back(out);
        continue;
      }
      find.Reset();

      const MatchResult match = MatchMessage(index, m, rules);
      const std::string fresh = FreshText(m.text, m.subject);
      const Suggestion suggestion = suggester.Suggest(m.subject, fresh);
      // A forward's own date is when the fieldworker passed it on; the
      // employer's date is in the forwarded header block.
      std::optional<int64_t> date = m.forwarded_date ? m.forwarded_date : m.date ? m.date : raw.envelope_time;
      const char* date_source = m.forwarded_date    ? "forwarded"
                                : m.date            ? "header"
                                : raw.envelope_time ? "envelope"
                                                    : "none";

      nlohmann::json phrases = nlohmann::json::array(), contexts = nlohmann::json::array();
      for (const auto& e : suggestion.evidence) {
        phrases.push_back({{"code", e.code}, {"phrase", e.phrase}, {"where", e.where}, {"negated", e.negated}});
        contexts.push_back(e.context);
      }
      nlohmann::json evidence = {{"match", MatchStatusName(match.status)},
                                 {"date", date_source},
                                 {"candidates", match.candidates},
                                 {"phrases", phrases}};
      nlohmann::json excerpt = {
          {"from", m.from},       {"to", m.to},
          {"subject", m.subject}, {"message_id", m.message_id},
          {"where", raw.where},   {"text", Clip(MakeSearchText(fresh).plain, rules.excerpt_chars)},
          {"contexts", contexts}};
      std::string sender = m.sender_addresses.empty() ? "" : m.sender_addresses.front();

      ins.Bind(1, key).Bind(2, SourceName(batch));
      if (sender.empty())
        ins.BindNull(3);
      else
        ins.Bind(3, DigestOrNull(sender));
      if (match.profile_mailbox.empty())
        ins.BindNull(4);
      else
        ins.Bind(4, match.profile_mailbox);
      if (m.subject.empty())
        ins.BindNull(5);
      else
        ins.Bind(5, DigestOrNull(m.subject));
      if (date)
        ins.Bind(6, FormatIsoTime(*date));
      else
        ins.BindNull(6);
      ins.Bind(7, Sha256Hex(CanonicalRaw(raw.raw))).Bind(8, excerpt.dump());
      if (match.status == MatchStatus::kMatched)
        ins.Bind(9, match.probe_id);
      else
        ins.BindNull(9);
      ins.Bind(10, std::string(MatchStatusName(match.status)) + ": " + match.reason);
      if (suggestion.code.empty())
        ins.BindNull(11);
      else
        ins.Bind(11, suggestion.code);
      ins.Bind(12, evidence.dump()).Bind(13, write.seq()).Run();

      out.message = store.LastInsertId();
      out.status = MatchStatusName(match.status);
      out.probe_ref = match.probe_ref;
      out.profile = match.profile_mailbox;
      out.employer_key = match.employer_key;
      out.suggested_code = suggestion.code;
      out.reason = match.reason;
      ++summary.stored;
      if (match.status == MatchStatus::kMatched)
        ++summary.matched;
      else
        ++summary.queued;
      summary.messages.push_back(out);
    }
  }
  if (summary.stored == 0) return summary;  // nothing new: the transaction rolls back, the chain is unchanged
  std::string sources;
  for (const auto& b : batches) sources += (sources.empty() ? "" : ", ") + SourceName(b);
  summary.audit_hash = write.Commit("mail from " + sources + ": " + std::to_string(summary.read) + " read, " +
                                    std::to_string(summary.stored) + " stored (" + std::to_string(summary.matched) +
                                    " matched to a probe, " + std::to_string(summary.queued) + " to assign), " +
                                    std::to_string(summary.duplicates) + " stored before; all wait for review");
  return summary;
}

}  // namespace twinprobe
