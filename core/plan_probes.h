#pragma once
// The current plan's probes in sending order, and sendings written straight
// from the plan. For `demo`, which sends every probe at its planned time;
// a study's own sendings go through `sent` (collector/responses.h), which
// checks each one.
#include <cstdint>
#include <string>
#include <vector>

#include "core/store.h"

namespace twinprobe {

struct PlannedProbeRow {
  int64_t id = 0;
  std::string ref;
  std::string planned_at;  // "" when absent
  std::string arm_label;
  std::string stratum_value;  // of the stratum asked for; "" when the vacancy has none
  int64_t vacancy_id = 0;
};

// The current plan's probes by vacancy, then send order, with the value of
// the vacancy's stratum `stratum` (e.g. "occupation").
std::vector<PlannedProbeRow> ReadPlannedProbes(Store& store, const std::string& stratum);

// Appends sending rows; the statement is prepared once. Use inside the
// caller's AuditedWrite (`seq`).
class PlannedSendingWriter {
 public:
  explicit PlannedSendingWriter(Store& store);
  void Insert(int64_t seq, int64_t probe_id, const std::string& sent_at, const std::string& entered_by,
              const std::string& entered_at);

 private:
  Stmt insert_;
};

}  // namespace twinprobe
