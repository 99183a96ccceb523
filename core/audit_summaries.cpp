#include "core/audit_summaries.h"

#include <cstdio>

namespace twinprobe {
namespace {

std::string Supersedes(int64_t superseded) {
  return superseded ? " (supersedes response " + std::to_string(superseded) + ")" : "";
}

}  // namespace

std::string RecordSummary(std::string_view probe_ref, std::string_view code, bool late, int64_t superseded) {
  return "record " + std::string(probe_ref) + " " + std::string(code) + (late ? " (late)" : "") + Supersedes(superseded);
}

std::string SentSummary(std::string_view probe_ref, std::string_view sent_at, std::string_view replaces) {
  return "sent " + std::string(probe_ref) + " at " + std::string(sent_at) +
         (replaces.empty() ? "" : " (replaces " + std::string(replaces) + ")");
}

std::string DeclineSummary(std::string_view probe_ref, std::string_view declined_at) {
  return "decline " + std::string(probe_ref) + " at " + std::string(declined_at);
}

std::string WithdrawSummary(std::string_view vacancy_ref, std::string_view withdrawn_at, std::string_view reason) {
  return "withdraw " + std::string(vacancy_ref) + " at " + std::string(withdrawn_at) + ": " + std::string(reason);
}

std::string ReviewDismissedSummary(int64_t message_id) {
  return "review message " + std::to_string(message_id) + ": dismissed (no response recorded)";
}

std::string ReviewRecordedSummary(int64_t message_id, std::string_view decision, std::string_view code,
                                  std::string_view probe_ref, int64_t superseded) {
  return "review message " + std::to_string(message_id) + ": " + std::string(decision) + " " + std::string(code) +
         " for " + std::string(probe_ref) + Supersedes(superseded);
}

std::string ImportOutcomesSummary(std::string_view path, int64_t rows_landed, int64_t rows_rejected) {
  return "import outcomes " + std::string(path) + ": " + std::to_string(rows_landed) + " rows landed, " +
         std::to_string(rows_rejected) + " rejected";
}

std::string MonitorLookSummary(int64_t look, std::string_view kind, int64_t sets, int64_t planned_sets,
                               int64_t reference_only, int64_t other_only, int64_t lower, double alpha_spent,
                               std::string_view decision) {
  const int64_t n = reference_only + other_only;
  char spent[40];
  std::snprintf(spent, sizeof spent, "%.6g", alpha_spent);
  return "monitor look " + std::to_string(look) + " (" + std::string(kind) + ") at " + std::to_string(sets) + " of " +
         std::to_string(planned_sets) + " sets: " + std::to_string(reference_only) + " reference only, " +
         std::to_string(other_only) + " other only, " +
         (lower >= 0 ? "stop at " + std::to_string(n - lower) + " of " + std::to_string(n) : std::string("cannot stop")) +
         ", alpha spent " + spent + ": " + std::string(decision);
}

std::string ImportSendingsSummary(std::string_view path, int64_t rows_landed, int64_t rows_rejected) {
  return "import sendings " + std::string(path) + ": " + std::to_string(rows_landed) + " rows landed, " +
         std::to_string(rows_rejected) + " rejected";
}

std::string HandoutSummary(std::string_view office, int64_t vacancies, int64_t probes, std::string_view office_head) {
  return "handout to office " + std::string(office) + ": " + std::to_string(vacancies) + " vacancies, " +
         std::to_string(probes) + " probes (office head " + std::string(office_head.substr(0, 16)) + ")";
}

std::string OfficeHandoutSummary(std::string_view office, std::string_view plan_hash, int64_t vacancies,
                                 int64_t probes) {
  return "handout of plan " + std::string(plan_hash.substr(0, 16)) + " to office " + std::string(office) + ": " +
         std::to_string(vacancies) + " vacancies, " + std::to_string(probes) + " probes";
}

std::string MergeSummary(std::string_view office, int64_t head_seq, std::string_view head_hash,
                         const MergedRowCounts& c) {
  return "merge office " + std::string(office) + " up to its entry " + std::to_string(head_seq) + " (head " +
         std::string(head_hash.substr(0, 16)) + "): sendings " + std::to_string(c.sendings) + ", responses " +
         std::to_string(c.responses) + ", declines " + std::to_string(c.declines) + ", mail messages " +
         std::to_string(c.mail_messages) + ", review decisions " + std::to_string(c.review_decisions) +
         ", conflict choices " + std::to_string(c.choices);
}

}  // namespace twinprobe
