#include "collector/mail_intake.h"

#include <nlohmann/json.hpp>
#include <set>

#include "collector/mail_match.h"
#include "collector/mail_message.h"
#include "collector/mail_suggest.h"
#include "collector/mail_text.h"
#include "core/audit.h"
#include "core/clock.h"
#include "core/mail_log.h"
#include "core/pseudonym.h"
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
  MailLog log(store);
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
      if (std::optional<int64_t> before = log.Find(key)) {
        out.message = *before;
        out.status = "duplicate";
        ++summary.duplicates;
        summary.messages.push_back(out);
        continue;
      }

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

      MailMessageRow row;
      row.key = key;
      row.source = SourceName(batch);
      if (!sender.empty()) row.from_digest = KeyedDigest(store, sender);
      if (!match.profile_mailbox.empty()) row.profile_mailbox = match.profile_mailbox;
      if (!m.subject.empty()) row.subject_digest = KeyedDigest(store, m.subject);
      if (date) row.sent_date = FormatIsoTime(*date);
      row.body_sha256 = Sha256Hex(CanonicalRaw(raw.raw));
      row.excerpt = excerpt.dump();
      if (match.status == MatchStatus::kMatched) row.probe_id = match.probe_id;
      row.match_reason = std::string(MatchStatusName(match.status)) + ": " + match.reason;
      if (!suggestion.code.empty()) row.suggested_code = suggestion.code;
      row.evidence = evidence.dump();
      out.message = log.Insert(write.seq(), row);
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
