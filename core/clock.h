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
// Returns nullopt for anything else, including impossible dates.
std::optional<int64_t> ParseIsoTime(std::string_view text);
std::string FormatIsoTime(int64_t epoch_seconds);     // "YYYY-MM-DDTHH:MM:SSZ"
std::string FormatIsoDate(int64_t epoch_seconds);     // "YYYY-MM-DD"
int WeekdayOf(int64_t epoch_seconds);                 // 0 = Monday … 6 = Sunday

}  // namespace twinprobe
