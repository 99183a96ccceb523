#pragma once
// `history PROBE`: everything the store holds about one probe, in the order
// it was entered: its sendings, every response (superseded ones included,
// with what superseded what) and declines, each with who entered it and
// when, and the audit entry that sealed it. Read only.
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct HistoryEvent {
  std::string kind;  // sending | response | decline
  int64_t id = 0;    // row id in its table
  int64_t audit_seq = 0;
  std::string entered_by, entered_at;
  std::string at;  // sent_at, received_at or declined_at ("" when not known)
  // Responses only:
  std::string code, channel, origin, flags;
  std::string note;         // "" when none or purged
  bool note_purged = false; // a note existed (its SHA-256 is kept) but purge removed it
  bool positive = false;
  int64_t supersedes = 0, superseded_by = 0;  // response ids, 0 if none
  bool current = false;     // the response analysis uses
};

struct ProbeHistory {
  std::string probe, vacancy, employer_key, arm, profile, planned_at, plan_origin;
  std::vector<std::pair<std::string, std::string>> strata;  // name, value
  std::vector<HistoryEvent> events;  // by audit entry, then sending, response, decline
  int current_response = -1;         // index into events, -1 if no response
};

// Errors: a probe the current plan does not have (bad input).
Result<ProbeHistory> LoadHistory(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref);

}  // namespace twinprobe
