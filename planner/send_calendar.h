#pragma once
// When probes may be sent: the design's sending days and hours (UTC) as a
// weekly pattern of open minutes, and the draws the planner makes from it.
// Times are whole minutes; epoch seconds are minute * 60.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "stats/random.h"

namespace twinprobe {

class SendCalendar {
 public:
  // Requires a schedule that passed design validation (at least one sending
  // day, 0 <= hour_open < hour_close <= 24).
  explicit SendCalendar(const Schedule& schedule);

  // Open minutes in [from_minute, to_minute] (both inclusive); 0 if to < from.
  int64_t OpenMinutes(int64_t from_minute, int64_t to_minute) const;
  // The open minute that has `rank` open minutes before it at or after
  // from_minute (rank 0 is the first open minute at or after from_minute).
  int64_t NthOpenMinute(int64_t from_minute, int64_t rank) const;
  bool IsOpen(int64_t minute) const;

  // First sending day (midnight, epoch seconds) at or after the day holding `t`.
  int64_t SendingDayOnOrAfter(int64_t t) const;
  // The next sending day strictly after the sending day `day` (midnight).
  int64_t NextSendingDay(int64_t day) const;

  // A minute drawn uniformly from the open minutes of the sending day `day`.
  int64_t DrawTimeOnDay(int64_t day, stats::Rng& rng) const;
  // A minute drawn uniformly from the open minutes lying gap_min..gap_max
  // hours after `minute`; nullopt when none is open (see CheckGapsKeepable).
  std::optional<int64_t> DrawAfterGap(int64_t minute, int gap_min_hours, int gap_max_hours, stats::Rng& rng) const;

  // The first open minute of the week (Monday 00:00 = 0) from which no open
  // minute lies in the gap range, or nullopt when the range can always be kept.
  std::optional<int> UnkeepableWeekMinute(int gap_min_hours, int gap_max_hours) const;

 private:
  // Open minutes before `minute` counted from the Monday 1969-12-29 00:00.
  int64_t OpenBefore(int64_t minute) const;

  static constexpr int kWeek = 7 * 24 * 60;
  std::vector<uint8_t> open_;     // per minute of the week
  std::vector<int32_t> prefix_;   // prefix_[w] = open minutes in [0, w) of the week
  int64_t per_week_ = 0;
};

// Checks that from every open minute some open minute lies gap_min..gap_max
// hours later, so every gap the planner draws honours the declared range.
// Fails with `where` (the gap_hours position) and names the weekday and time.
Status CheckGapsKeepable(const Schedule& schedule, const std::string& where);

}  // namespace twinprobe
