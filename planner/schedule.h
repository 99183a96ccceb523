#pragma once
// Fieldwork: what to send and when (`schedule`), from the stored plan.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/schedule_rows.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// ScheduledProbe (one probe with its sending) is core/schedule_rows.h.

struct ScheduleQuery {
  std::optional<int64_t> due_until;  // only probes planned before this time (epoch seconds)
  bool include_sent = false;
};

// Probes of the current plan in planned-time order (then probe reference).
// Fails when the store holds no plan.
Result<std::vector<ScheduledProbe>> ListSchedule(Store& store, const ScheduleQuery& query);

}  // namespace twinprobe
