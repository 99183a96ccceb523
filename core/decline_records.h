#pragma once
// The store side of declines (collector/declines.h keeps the rules): the
// append-only decline rows and the positive responses still to decline.
// SQLite failures throw StoreError (core/store.h).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct DeclineRow {
  int64_t probe_id = 0;
  std::string declined_at;
  std::optional<std::string> channel;
  std::string entered_by, entered_at;
  int64_t audit_seq = 0;
};

void InsertDecline(Store& store, const DeclineRow& row);

// When the probe was first declined; none when it never was. One decline
// answers the probe (ReadUndeclinedResponses counts any), so a second is
// reported as already done rather than stored.
std::optional<std::string> FirstDeclinedAt(Store& store, int64_t probe_id);

// A current probe's current response with no decline recorded yet (whether
// the code is positive is the caller's rule).
struct UndeclinedResponse {
  std::string probe_ref, vacancy_ref, employer_key;
  std::string profile;  // display name, "" without a profile
  std::string code, received_at;
};

std::vector<UndeclinedResponse> ReadUndeclinedResponses(Store& store);

// The declines section of the report and the export's declines table read
// every current probe's current response with its first decline (if any).
// Whether a code is positive and whether a deadline passed are the callers'
// rules (analysis/declines.h).
struct DeclineFact {
  std::string probe_ref, vacancy_ref;
  int64_t response_id = 0;
  std::string code;
  std::string received_at;  // "" when stored without a time
  std::string declined_at;  // the first decline; "" when never declined
};

struct DeclineReading {
  int decline_within_hours = 0;  // the plan's [ethics] decline_within_hours; 0 when none was stored
  std::vector<DeclineFact> responses;  // by probe reference
};

DeclineReading ReadDeclineFacts(Store& store);

}  // namespace twinprobe
