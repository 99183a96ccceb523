#pragma once
// The wording of the audit summaries that `verify` rebuilds from the rows
// they seal (core/verify_summary.h). One function per summary: the command
// that writes the entry and `verify` both call it, so the stored format has
// one definition. Never change a wording: stores written before keep it, and
// `verify` would call their entries changed.
#include <cstdint>
#include <string>
#include <string_view>

namespace twinprobe {

// `record`: "record P00017 invitation (late) (supersedes response 12)";
// `superseded` 0 when it replaces nothing.
std::string RecordSummary(std::string_view probe_ref, std::string_view code, bool late, int64_t superseded);

// `sent`: "sent P00017 at 2027-03-01T09:14:00Z (replaces 2027-02-28T00:00:00Z)";
// `replaces` "" for a probe's first sending.
std::string SentSummary(std::string_view probe_ref, std::string_view sent_at, std::string_view replaces);

// `decline`: "decline P00017 at 2027-03-04T15:30:00Z".
std::string DeclineSummary(std::string_view probe_ref, std::string_view declined_at);

// `review` that dismissed a message: "review message 7: dismissed (no response recorded)".
std::string ReviewDismissedSummary(int64_t message_id);

// `review` that recorded a response: "review message 7: confirmed invitation
// for P00017 (supersedes response 12)"; `decision` as stored
// (core/stored_codes.h ReviewDecision).
std::string ReviewRecordedSummary(int64_t message_id, std::string_view decision, std::string_view code,
                                  std::string_view probe_ref, int64_t superseded);

// `import outcomes`: "import outcomes FILE: 3 rows landed, 1 rejected".
std::string ImportOutcomesSummary(std::string_view path, int64_t rows_landed, int64_t rows_rejected);

// `withdraw`: "withdraw V0017 at 2027-03-04T15:30:00Z: the posting closed";
// the reason as given (one line; the command refuses line breaks).
std::string WithdrawSummary(std::string_view vacancy_ref, std::string_view withdrawn_at, std::string_view reason);

// `monitor`, one entry per look taken: "monitor look 2 (planned) at 300 of
// 400 sets: 41 reference only, 19 other only, stop at 44 of 60, alpha spent
// 0.00834: continue"; `lower` -1 reads "cannot stop".
std::string MonitorLookSummary(int64_t look, std::string_view kind, int64_t sets, int64_t planned_sets,
                               int64_t reference_only, int64_t other_only, int64_t lower, double alpha_spent,
                               std::string_view decision);

// `import sendings`: "import sendings log.csv: 12 rows landed, 1 rejected".
std::string ImportSendingsSummary(std::string_view path, int64_t rows_landed, int64_t rows_rejected);

// `handout` in the main store: "handout to office north-fen: 136 vacancies,
// 272 probes (office head 0123456789abcdef)"; the head is the office chain's
// first, shortened to 16 hex digits (the sealed handout row keeps it whole).
std::string HandoutSummary(std::string_view office, int64_t vacancies, int64_t probes, std::string_view office_head);

// `handout`, the first entry of an office's store: "handout of plan
// 0123456789abcdef to office north-fen: 136 vacancies, 272 probes".
std::string OfficeHandoutSummary(std::string_view office, std::string_view plan_hash, int64_t vacancies,
                                 int64_t probes);

// What one merge brought in from an office (rows of each kind).
struct MergedRowCounts {
  int64_t sendings = 0, responses = 0, declines = 0, mail_messages = 0, review_decisions = 0, choices = 0;
};

// `merge`: "merge office north-fen up to its entry 41 (head
// 0123456789abcdef): sendings 12, responses 30, declines 1, mail messages 0,
// review decisions 0, conflict choices 1".
std::string MergeSummary(std::string_view office, int64_t head_seq, std::string_view head_hash,
                         const MergedRowCounts& counts);

}  // namespace twinprobe
