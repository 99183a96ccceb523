#pragma once
// Declining invitations and offers (ethics/README.md): every positive
// response must be declined within the study's decline deadline so the
// employer's vacancy is not held. `decline` records that it was done; the
// overdue list drives the reminders in `schedule` and `record`.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct DeclineRecord {
  std::string probe_ref;
  std::string code;         // the positive response declined, e.g. "invitation"
  std::string declined_at;  // as stored; the earlier time when `already`
  bool already = false;     // the probe was declined before: nothing written
  std::string received_at;  // when the declined response arrived; "" unknown
};

// Records that the positive response to `probe_ref` was declined at
// `declined_at` (ISO, offsets allowed; "" = now). A probe declined before is
// reported with `already` set and its first time, and nothing is written.
// Errors (bad input, store unchanged): unknown probe, unreadable time, no
// response recorded, a current response that is not positive (named, with
// its time), a decline before the response was received (compared by day
// when either is a date alone, collector/event_time.h).
Result<DeclineRecord> RecordDecline(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref,
                                    const std::string& declined_at, const std::string& channel);

// What was done, in the words `decline` and the desk both say: "Recorded that
// the invitation to P00031 was declined at …." or, when `already`, "The
// invitation to P00031 was already declined at …; nothing recorded."
std::string DeclineSentence(const DeclineRecord& d);

// How messages name a positive response: "invitation", "offer",
// "request for information" (info_request), else the code in quotes.
std::string PositiveResponseWords(const std::string& code);

// Where the decline letter is, in every study folder `init` writes.
inline constexpr const char* kDeclineLetterPath = "ethics/letters/decline-invitation.md";

// One positive response's decline deadline in the words `record`, `review`,
// `schedule`, `decline` and the desk all use: "decline the request for
// information to P00031 by 2027-03-06T10:00:00Z (within 48 hours of receipt)"
// (the rule's words from DeclineWithinWords, core/ethics_gate.h).
std::string DeclineDeadlineWords(const std::string& code, const std::string& probe_ref, int64_t deadline,
                                 int decline_within_hours);

// The reminder after a positive response is recorded: "Decline the
// invitation to P00031 by … (within 48 hours of receipt) with the letter in
// ethics/letters/decline-invitation.md, then <next_step>." `next_step` is
// "run 'twinprobe --study my-study decline P00031'" in the commands, the
// Declines page on the desk. `letter` is where the reader finds the letter:
// the commands name it inside the study folder the user gave, the desk (whose
// reader has no shell) keeps kDeclineLetterPath.
std::string DeclineReminder(const std::string& code, const std::string& probe_ref, int64_t deadline,
                            int decline_within_hours, const std::string& next_step,
                            const std::string& letter = kDeclineLetterPath);

// After `decline`: whether it kept the deadline, e.g. "The deadline was to
// decline the invitation to P00031 by … (within 48 hours of receipt): kept."
// or "…: missed by 5 hours."; "" when the study sets no deadline.
std::string DeclineKeptSentence(const DeclineRecord& d, int decline_within_hours);

struct PendingDecline {
  std::string probe_ref;
  std::string vacancy_ref;
  std::string employer_key;
  std::string profile;
  std::string code;
  std::string received_at;
  int64_t deadline = 0;  // UTC seconds
  bool overdue = false;  // deadline < now
};

// Positive current responses with no decline recorded, most urgent first.
std::vector<PendingDecline> PendingDeclines(Store& store, const OutcomeScheme& scheme, int decline_within_hours,
                                            int64_t now);

}  // namespace twinprobe
