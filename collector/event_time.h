#pragma once
// The time of a fieldwork event (a sending, a response) as a person gives
// it: either a full UTC time or only a date. Responses often arrive with a
// date alone ("the letter came on the 4th"). The store keeps full times
// (core/clock.h), so a date alone is stored as midnight UTC; but checks treat
// it as "some time that day": compared with a full time, only the days are
// compared, so a response dated the sending day is not "before the sending".
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace twinprobe {

struct EventTime {
  int64_t epoch = 0;       // UTC seconds; midnight for a date alone
  bool date_only = false;  // only the day is known

  // As stored: "YYYY-MM-DDTHH:MM:SSZ" (midnight for a date alone).
  std::string text() const;
};

// Accepts what core/clock.h ParseIsoTime accepts; a bare "YYYY-MM-DD" gives
// a date-only time. nullopt for anything else (including impossible dates).
std::optional<EventTime> ParseEventTime(std::string_view text);

// The stored text of a time that ParseEventTime accepted, built from the
// input by rearranging characters (no calendar arithmetic; bulk imports call
// it per row): "2027-03-01 09:15" -> "2027-03-01T09:15:00Z", "2027-03-01" ->
// "2027-03-01T00:00:00Z". Equal to ParseEventTime(text)->text().
// Precondition: ParseEventTime(text) succeeded.
std::string CanonicalEventText(std::string_view text);

// True when `a` is certainly before `b`: compared by day when either is a
// date alone, else by second.
bool IsBefore(const EventTime& a, const EventTime& b);

// True when `response` is certainly later than `window_days` days after
// `sent` (by day when either is a date alone).
bool IsAfterWindow(const EventTime& sent, const EventTime& response, int window_days);

// Whole days from `a` to `b` (by day), e.g. for messages.
int64_t DaysBetween(const EventTime& a, const EventTime& b);

}  // namespace twinprobe
