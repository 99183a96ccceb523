#include "core/audit_summaries.h"

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

std::string ImportSendingsSummary(std::string_view path, int64_t rows_landed, int64_t rows_rejected) {
  return "import sendings " + std::string(path) + ": " + std::to_string(rows_landed) + " rows landed, " +
         std::to_string(rows_rejected) + " rejected";
}

}  // namespace twinprobe
