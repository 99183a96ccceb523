#include "planner/schedule.h"

#include "core/clock.h"
#include "core/plan_rows.h"

namespace twinprobe {

Result<std::vector<ScheduledProbe>> ListSchedule(Store& store, const ScheduleQuery& query) {
  if (!HasCurrentPlan(store))
    return BadInput(store.path(), "the store holds no plan yet", "run 'twinprobe plan' first");
  std::vector<ScheduledProbe> out;
  for (ScheduledProbe& s : ReadScheduleRows(store)) {
    if (!query.include_sent && !s.sent_at.empty()) continue;
    if (query.due_until) {
      auto t = ParseIsoTime(s.planned_at);
      if (!t || *t >= *query.due_until) continue;
    }
    out.push_back(std::move(s));
  }
  return out;
}

}  // namespace twinprobe
