#pragma once
// The mail_message table: what `mail` logged of each message, and the probes
// a message may be matched to. The rules (keys, matching, suggestions, what
// is sealed and what purge clears) are the collector's (collector/mail_*);
// this file only reads and writes the rows.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/store.h"

namespace twinprobe {

// One mail_message row as `mail` writes it; nullopt is stored as NULL.
struct MailMessageRow {
  std::string key;                             // message_id column: "mid:…" or "raw:…"
  std::string source;                          // mailbox column: mbox:PATH, maildir:DIR, or the redacted IMAP URL
  std::optional<std::string> from_digest;      // "hmac:…" (KeyedDigest) of the first sender
  std::optional<std::string> profile_mailbox;  // to_addr column: the profile the message was for
  std::optional<std::string> subject_digest;   // "hmac:…" (KeyedDigest) of the subject
  std::optional<std::string> sent_date;        // ISO time, UTC
  std::string body_sha256;
  std::string excerpt;              // JSON; outside the row digest (purge clears it), its SHA-256 sealed in mail_excerpt_seal
  std::optional<int64_t> probe_id;  // set when matched to one probe
  std::string match_reason;
  std::optional<std::string> suggested_code;
  std::string evidence;  // JSON
};

// Looks messages up by key and appends new ones; its statements are
// prepared once for a whole intake. Use inside the caller's AuditedWrite.
class MailLog {
 public:
  explicit MailLog(Store& store);
  // The id of the message stored under `key`, if any.
  std::optional<int64_t> Find(const std::string& key);
  // Appends the row under audit entry `seq`; returns its id.
  int64_t Insert(int64_t seq, const MailMessageRow& row);

 private:
  Store& store_;
  Stmt find_;
  Stmt insert_;
  Stmt seal_;  // mail_excerpt_seal
};

// A probe of the current plan with what matching needs: its profile's
// mailbox and its vacancy's employer (name and contact are "" after purge).
struct MailProbeRow {
  int64_t probe_id = 0;
  std::string probe_ref;
  std::string profile_mailbox;  // lowercased; "" if none
  std::string vacancy_ref;
  std::string employer_key;      // "" if none
  std::string employer_name;     // as stored
  std::string employer_contact;  // lowercased
};

// Every probe of the current plan, in id order.
std::vector<MailProbeRow> ReadMailProbes(Store& store);

// The lowercased mailbox of the profile of current-plan probe `probe_ref`;
// nullopt when no such probe exists ("" when it has no mailbox).
std::optional<std::string> ReadProbeMailbox(Store& store, const std::string& probe_ref);

}  // namespace twinprobe
