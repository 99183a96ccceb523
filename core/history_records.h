#pragma once
// The store side of `history PROBE` (collector/history.h orders and
// explains): the probe with its vacancy, arm and plan, and every sending,
// response and decline row of it. Read only; SQLite failures throw
// StoreError (core/store.h).
#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace twinprobe {

class Store;

struct ProbeHistoryHead {
  int64_t probe_id = 0, vacancy_id = 0;
  std::string probe, vacancy, employer_key, arm, profile, planned_at, plan_origin;  // "" when missing
};

struct SendingHistoryRow {
  int64_t id = 0, audit_seq = 0;
  std::string sent_at, entered_by, entered_at;
};

struct ResponseHistoryRow {
  int64_t id = 0, audit_seq = 0;
  std::string code, received_at, channel, note, origin, flags, entered_by, entered_at;  // "" when missing
  bool note_purged = false;    // the note is gone but its SHA-256 is kept
  int64_t supersedes = 0;      // 0 if none
  int64_t superseded_by = 0;   // the oldest response superseding it, 0 if none
};

struct DeclineHistoryRow {
  int64_t id = 0, audit_seq = 0;
  std::string declined_at, channel, entered_by, entered_at;
};

// The current plan's probe `ref`; none if the plan has no such probe.
std::optional<ProbeHistoryHead> ReadProbeHistoryHead(Store& store, const std::string& ref);
// The vacancy's strata (name, value) in the order they were stored.
std::vector<std::pair<std::string, std::string>> ReadVacancyStrata(Store& store, int64_t vacancy_id);
std::vector<SendingHistoryRow> ReadSendingHistory(Store& store, int64_t probe_id);
std::vector<ResponseHistoryRow> ReadResponseHistory(Store& store, int64_t probe_id);
// Empty for a store older than the decline table.
std::vector<DeclineHistoryRow> ReadDeclineHistory(Store& store, int64_t probe_id);

}  // namespace twinprobe
