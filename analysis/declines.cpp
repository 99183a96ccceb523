#include "analysis/declines.h"

#include "core/clock.h"
#include "core/ethics_gate.h"

namespace twinprobe {

DeclineCounts CountDeclines(const DeclineReading& reading, const OutcomeScheme& scheme, int64_t now) {
  DeclineCounts c;
  c.decline_within_hours = reading.decline_within_hours;
  c.study_clock = now;
  if (c.decline_within_hours > 0) c.rule = DeclineWithinWords(c.decline_within_hours);
  EthicsBlock ethics;
  ethics.decline_within_hours = c.decline_within_hours;
  for (const DeclineFact& f : reading.responses) {
    if (!scheme.is_positive(f.code)) continue;
    ++c.positive;
    // A response stored without a time (or a study without a deadline) has
    // no deadline to keep: it is positive but not due.
    std::optional<int64_t> received = ParseIsoTime(f.received_at);
    if (c.decline_within_hours <= 0 || !received) continue;
    ++c.due;
    // The same deadline `record`, `schedule` and `decline` name (core/ethics_gate.h).
    const int64_t deadline = DeclineDeadline(ethics, *received);
    if (std::optional<int64_t> declined = ParseIsoTime(f.declined_at)) {
      ++(*declined <= deadline ? c.on_time : c.late);
    } else {
      ++(deadline < now ? c.missing : c.within);
    }
  }
  c.present = c.positive > 0;
  return c;
}

}  // namespace twinprobe
