#pragma once
// Time as the store keeps it: UTC, ISO 8601 ("2026-03-14T09:30:00Z").
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace twinprobe {

// Now, or $TWINPROBE_NOW when set (tests and the demo pin the clock with it).
std::string NowIso();
int64_t NowEpoch();

// Parses "YYYY-MM-DD", "YYYY-MM-DDTHH:MM", "YYYY-MM-DDTHH:MM:SS" (a space may
// replace the T; a trailing Z is allowed) as UTC seconds since 1970. A time
// of day may end in an offset "+HH:MM" or "-HH:MM" instead of Z
// ("2027-03-01T09:14+01:00" is 08:14 UTC); a bare date is UTC midnight.
// Returns nullopt for anything else, including impossible dates and times
// outside the accepted range below.
std::optional<int64_t> ParseIsoTime(std::string_view text);

// The times a study may hold: 1900-01-01T00:00:00Z to 2999-12-31T23:59:59Z
// (after any offset is applied). Fieldwork happens within it, and a plan or a
// window added to its end still prints as four-digit years; "9999-12-30" or
// "0000-01-01" is a typing error, not a date.
inline constexpr int64_t kEarliestTime = -2208988800;  // 1900-01-01T00:00:00Z
inline constexpr int64_t kLatestTime = 32503679999;    // 2999-12-31T23:59:59Z
inline constexpr std::string_view kAcceptedTimeRange = "1900-01-01 to 2999-12-31";

// Why ParseIsoTime refused `text`, to follow the quoted text in a message:
// "is outside the accepted range 1900-01-01 to 2999-12-31" when it is a
// well-formed time outside kEarliestTime..kLatestTime, else `usual` (for
// example "is not a date or time").
std::string WhyNotATime(std::string_view text, std::string_view usual);
std::string FormatIsoTime(int64_t epoch_seconds);     // "YYYY-MM-DDTHH:MM:SSZ"
std::string FormatIsoDate(int64_t epoch_seconds);     // "YYYY-MM-DD"
int WeekdayOf(int64_t epoch_seconds);                 // 0 = Monday … 6 = Sunday

}  // namespace twinprobe
