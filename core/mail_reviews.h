#pragma once
// The review queue in the store: logged mail messages (mail_message) with
// the decision a person made on each (review_decision). What a row means and
// the checks before a decision are the collector's (collector/mail_review.h).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/store.h"
#include "core/stored_codes.h"

namespace twinprobe {

// One logged message as the queue shows it; absent values read as "".
struct MailReviewRow {
  int64_t message = 0;       // mail_message id
  std::string source;        // mbox:FILE, maildir:DIR, or the IMAP URL
  std::string date;          // sent_date
  std::string probe_ref;     // of the matched probe
  std::string profile;       // to_addr: the profile's mailbox
  std::string employer_key;  // of the matched probe's vacancy
  std::string match_reason;  // "STATUS: reason"
  std::string suggested_code;
  std::string evidence_json;                // "{}" when absent
  std::optional<std::string> excerpt_json;  // nullopt once purged
  std::optional<ReviewDecision> decision;   // nullopt: waiting
  std::string decided_by, decided_at;
  int64_t response_id = 0;  // 0: none
};

// Messages without a decision, oldest first; with `include_decided` all.
// Throws StoreError on a decision spelling this version does not know.
std::vector<MailReviewRow> ReadMailReviews(Store& store, bool include_decided);

// One message by id; nullopt when there is none.
std::optional<MailReviewRow> ReadMailReview(Store& store, int64_t message);

// Appends a review_decision row under audit entry `seq`; `response_id` is
// nullopt for a dismissal.
void InsertReviewDecision(Store& store, int64_t seq, int64_t message, ReviewDecision decision,
                          std::optional<int64_t> response_id, const std::string& decided_by,
                          const std::string& decided_at);

}  // namespace twinprobe
