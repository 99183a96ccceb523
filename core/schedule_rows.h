#pragma once
// What `schedule` reads of the stored plan: each probe of the current plan
// with its vacancy, employer pseudonym, profile and newest sending. Which of
// them are due is the planner's (planner/schedule.h).
#include <string>
#include <vector>

#include "core/store.h"

namespace twinprobe {

// Absent values read as "".
struct ScheduledProbe {
  std::string probe;     // P00001
  std::string vacancy;   // the vacancy's reference
  std::string employer;  // pseudonymous key (E-…)
  std::string arm;
  std::string profile;  // display name
  std::string mailbox;
  std::string phone;
  std::string template_path;
  int send_order = 1;
  std::string planned_at;  // ISO time
  std::string sent_at;     // ISO time of the newest `sent` entry, "" when not sent
};

// The current plan's probes by planned time, then probe reference, without
// the unsent probes of a withdrawn vacancy (they are not to be sent).
std::vector<ScheduledProbe> ReadScheduleRows(Store& store);

}  // namespace twinprobe
