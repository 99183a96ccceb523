#pragma once
// `twinprobe review`: the queue of logged mail messages that wait for a
// person, and the person's decision (docs/review.md). A decision is one
// AuditedWrite ("review"): a review_decision row, and for a confirmed or
// changed message a normal response row (AddResponse, origin "mail-review",
// channel "mail"), which supersedes an earlier response to the probe like
// any `record` does.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "collector/mail_suggest.h"
#include "core/design.h"
#include "core/status.h"
#include "core/store.h"
#include "core/stored_codes.h"

namespace twinprobe {

struct ReviewItem {
  int64_t message = 0;
  std::string source;                   // mbox:FILE, maildir:DIR, or the IMAP URL
  std::string date;                     // the message's date (ISO, UTC); "" if it had none
  std::string date_source;              // header | forwarded (the forwarded message's) | envelope (mbox/Maildir) | none
  std::string status;                   // matched | ambiguous | unmatched
  std::string probe_ref;                // matched probe ("" otherwise)
  std::string profile;                  // the profile's mailbox ("" if none was found)
  std::string employer_key;             // of the matched probe's vacancy
  std::string reason;                   // why it matched or not
  std::vector<std::string> candidates;  // ambiguous: "P00003 (domain)", …
  std::string suggested_code;           // "" : no rule applied
  std::vector<PhraseEvidence> evidence;  // with contexts while not purged
  // Unsealed text (empty after purge, then `purged` is true).
  std::string from, subject, excerpt, where;
  bool purged = false;
  // Set once decided.
  std::optional<ReviewDecision> decision;  // nullopt: waiting
  std::string decided_by, decided_at;
  int64_t response_id = 0;
};

// Messages that wait for a decision, oldest first; with `include_decided`
// every logged message.
std::vector<ReviewItem> LoadReviewQueue(Store& store, bool include_decided);

// One message by its number. Error: no such message.
Result<ReviewItem> LoadReviewItem(Store& store, int64_t message);

enum class ReviewAction { kConfirm, kCode, kDismiss };

struct ReviewRequest {
  int64_t message = 0;
  ReviewAction action = ReviewAction::kConfirm;
  std::string code;       // kCode: the code to record
  std::string probe_ref;  // assigns (or re-assigns) the message to this probe
  std::string at;         // received time; "" : the message's date
};

struct ReviewOutcome {
  ReviewItem item;          // as it was before the decision
  ReviewDecision decision = ReviewDecision::kDismissed;
  int64_t response_id = 0;  // 0 when dismissed
  std::string probe_ref, code, received_at;
  bool positive = false, late = false;
  int64_t days_after_sending = 0;
  int64_t superseded = 0;
  std::vector<std::string> warnings;  // e.g. the probe belongs to another profile
  std::string audit_hash;
};

// Records the decision. Errors: no such message; it was decided before;
// --confirm without a suggestion or without a probe; a probe with no sending
// (the message stays in the queue); a code or probe AddResponse refuses; no date in the message and no `at`; --probe or --at
// with a dismissal. The store is unchanged on error.
Result<ReviewOutcome> DecideReview(Store& store, const OutcomeScheme& scheme, const ReviewRequest& request);

}  // namespace twinprobe
