#pragma once
// `twinprobe mail`: storing what arrived in the study's mailboxes
// (docs/mail.md). Every message read is parsed, matched to a probe
// (collector/mail_match.h) and given a suggested code
// (collector/mail_suggest.h), then logged in mail_message, where it waits
// in the review queue. Nothing else is written: no response exists until a
// person confirms one with `review` (collector/mail_review.h).
//
// What the store keeps of a message (docs/mail.md, "What the store keeps"):
// sealed into the audit chain are a key (SHA-256 of the Message-ID, or of
// the whole message when it has none), the source, the profile address, the
// date, a digest of the whole message, the match (probe, reason naming only
// pseudonyms and references), the suggested code and the phrases that gave
// it; the sender and subject are sealed only as SHA-256 digests. The words
// a person needs to review it (sender, subject, an excerpt, each phrase in
// its context) are kept in the unsealed `excerpt` column, which purge clears.
#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "collector/mail_source.h"
#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// The messages one mailbox gave.
struct MailBatch {
  std::string kind;   // mbox | maildir | imap
  std::string label;  // the file, folder or redacted URL
  std::vector<RawMail> messages;
};

struct IntakeMessage {
  int64_t message = 0;  // mail_message id (for a duplicate: the id stored before)
  std::string where;    // file:line, file, or URL;UID=N
  std::string status;   // matched | ambiguous | unmatched | duplicate
  std::string probe_ref;
  std::string profile;
  std::string employer_key;
  std::string suggested_code;
  std::string reason;
  std::string subject;  // decoded, for the person at the terminal (not in the audit)
};

struct IntakeSummary {
  int64_t read = 0;
  int64_t stored = 0;      // new rows in mail_message
  int64_t duplicates = 0;  // seen before (this run or an earlier one)
  int64_t matched = 0;     // new rows matched to one probe
  int64_t queued = 0;      // new rows that need a person to assign a probe
  std::vector<IntakeMessage> messages;
  std::string audit_hash;  // "" when nothing new was stored (then nothing is written)
};

// The key a message is stored under: "mid:" + SHA-256 of its Message-ID
// (angle brackets and blanks trimmed), or "raw:" + SHA-256 of
// CanonicalRaw(raw) when it has none.
std::string MailKey(const std::string& message_id, const std::string& raw);

// Stores the new messages of `batches` in one AuditedWrite ("mail"). Writes
// nothing when every message was stored before. `progress`, when set, is
// called after each message with (done, total).
Result<IntakeSummary> IngestMail(Store& store, const MailRules& rules, const std::vector<MailBatch>& batches,
                                 const std::function<void(size_t, size_t)>& progress = {});

}  // namespace twinprobe
