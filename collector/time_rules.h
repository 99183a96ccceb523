#pragma once
// Plausible times: the one rule every writer of a fieldwork time calls
// (`sent`, `record`, `decline`, `import outcomes`, `import sendings` and the
// desk's forms), so a time that cannot have happened is refused the same way
// whichever door it comes through:
//   - the year lies in 1970–2200 (a typo such as 0202 or 20277 is not a date
//     a study can hold);
//   - it is not in the future beyond kClockSkewSeconds of the study clock
//     (core/clock.h NowEpoch, pinned by TWINPROBE_NOW);
//   - a sending is not before the schedule's start minus the design's
//     [schedule] early_days;
//   - a response is not before its probe's sending, a decline not before the
//     response it declines (by day when either is a date alone,
//     collector/event_time.h).
// Each refusal names the probe, both times and the fix. There is no way
// around it: a time that breaks a rule is corrected, not forced in.
#include <cstdint>
#include <optional>
#include <string>

#include "collector/event_time.h"
#include "core/status.h"

namespace twinprobe {

class Store;

// How far ahead of the study clock a time may be: two people's clocks (a
// phone, a laptop) disagree by seconds to minutes, never by more.
inline constexpr int64_t kClockSkewSeconds = 10 * 60;
inline constexpr int kFirstPlausibleYear = 1970;
inline constexpr int kLastPlausibleYear = 2200;

struct TimeRules {
  int64_t now = 0;                        // the study clock, UTC seconds
  std::optional<int64_t> schedule_start;  // first planned sending of the current plan; none when unplanned
  int early_days = 1;                     // [schedule] early_days
};

// The rules of the study in `store`: now from NowEpoch() and the schedule's
// start from the current plan's earliest planned sending.
TimeRules StudyTimeRules(Store& store, int early_days);

enum class TimedEvent { kSending, kResponse, kDecline };

struct TimedFact {
  TimedEvent event = TimedEvent::kSending;
  std::string probe_ref;
  EventTime at;
  // What must come first: the probe's sending (a response) or the response
  // declined (a decline); none when there is nothing to compare with.
  std::optional<EventTime> after;
  std::string after_words;  // a decline: what it declines, e.g. "invitation"
};

// OK when `fact` is plausible under `rules`; else a bad-input error at
// `where` ("" for the command line) naming the probe, both times and the fix.
Status CheckPlausibleTime(const TimeRules& rules, const TimedFact& fact, const std::string& where);

}  // namespace twinprobe
