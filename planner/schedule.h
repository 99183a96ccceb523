#pragma once
// Fieldwork: what to send and when (`schedule`), from the stored plan.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct ScheduledProbe {
  std::string probe;      // P00001
  std::string vacancy;    // the vacancy's reference
  std::string employer;   // pseudonymous key (E-…)
  std::string arm;
  std::string profile;    // display name
  std::string mailbox;
  std::string phone;
  std::string template_path;
  int send_order = 1;
  std::string planned_at;  // ISO time
  std::string sent_at;     // ISO time of the newest `sent` entry, "" when not sent
};

struct ScheduleQuery {
  std::optional<int64_t> due_until;  // only probes planned before this time (epoch seconds)
  bool include_sent = false;
};

// Probes of the current plan in planned-time order (then probe reference).
// Fails when the store holds no plan.
Result<std::vector<ScheduledProbe>> ListSchedule(Store& store, const ScheduleQuery& query);

}  // namespace twinprobe
