#include "planner/send_calendar.h"

#include <algorithm>
#include <cstdio>

namespace twinprobe {
namespace {

// Minutes are counted from Monday 1969-12-29 00:00 UTC, three days before
// the epoch (a Thursday), so minute / kWeek is a whole week.
constexpr int64_t kEpochShiftMinutes = 3 * 24 * 60;

int64_t FloorDiv(int64_t a, int64_t b) { return a >= 0 ? a / b : -((-a + b - 1) / b); }

}  // namespace

SendCalendar::SendCalendar(const Schedule& s) : open_(kWeek, 0), prefix_(kWeek + 1, 0) {
  for (int day : s.weekdays)
    for (int m = s.hour_open * 60; m < s.hour_close * 60; ++m) open_[day * 24 * 60 + m] = 1;
  for (int w = 0; w < kWeek; ++w) prefix_[w + 1] = prefix_[w] + open_[w];
  per_week_ = prefix_[kWeek];
}

int64_t SendCalendar::OpenBefore(int64_t minute) const {
  int64_t x = minute + kEpochShiftMinutes;
  int64_t week = FloorDiv(x, kWeek);
  return week * per_week_ + prefix_[x - week * kWeek];
}

bool SendCalendar::IsOpen(int64_t minute) const {
  int64_t x = minute + kEpochShiftMinutes;
  return open_[x - FloorDiv(x, kWeek) * kWeek] != 0;
}

int64_t SendCalendar::OpenMinutes(int64_t from, int64_t to) const {
  if (to < from) return 0;
  return OpenBefore(to + 1) - OpenBefore(from);
}

int64_t SendCalendar::NthOpenMinute(int64_t from, int64_t rank) const {
  int64_t target = OpenBefore(from) + rank;  // the open minute with `target` open minutes before it
  int64_t week = target / per_week_;
  int64_t rem = target - week * per_week_;
  // prefix_ is non-decreasing; the minute w with prefix_[w] == rem and open_[w].
  auto it = std::upper_bound(prefix_.begin(), prefix_.end(), static_cast<int32_t>(rem));
  int64_t w = (it - prefix_.begin()) - 1;
  return week * kWeek + w - kEpochShiftMinutes;
}

int64_t SendCalendar::SendingDayOnOrAfter(int64_t t) const {
  int64_t day = FloorDiv(t, 86400) * 86400;
  for (int k = 0; k < 7; ++k, day += 86400)
    if (OpenMinutes(day / 60, day / 60 + 24 * 60 - 1) > 0) return day;
  return day;  // unreachable for a validated schedule
}

int64_t SendCalendar::NextSendingDay(int64_t day) const { return SendingDayOnOrAfter(day + 86400); }

int64_t SendCalendar::DrawTimeOnDay(int64_t day, stats::Rng& rng) const {
  int64_t first = day / 60;
  int64_t n = OpenMinutes(first, first + 24 * 60 - 1);
  return NthOpenMinute(first, static_cast<int64_t>(rng.Below(static_cast<uint64_t>(n))));
}

std::optional<int64_t> SendCalendar::DrawAfterGap(int64_t minute, int gap_min_hours, int gap_max_hours,
                                                  stats::Rng& rng) const {
  int64_t from = minute + int64_t{gap_min_hours} * 60, to = minute + int64_t{gap_max_hours} * 60;
  int64_t n = OpenMinutes(from, to);
  if (n == 0) return std::nullopt;
  return NthOpenMinute(from, static_cast<int64_t>(rng.Below(static_cast<uint64_t>(n))));
}

std::optional<int> SendCalendar::UnkeepableWeekMinute(int gap_min_hours, int gap_max_hours) const {
  // The week pattern repeats, so checking one week of start minutes covers all.
  const int64_t monday = -kEpochShiftMinutes;
  for (int w = 0; w < kWeek; ++w) {
    if (!open_[w]) continue;
    int64_t m = monday + w;
    if (OpenMinutes(m + int64_t{gap_min_hours} * 60, m + int64_t{gap_max_hours} * 60) == 0) return w;
  }
  return std::nullopt;
}

Status CheckGapsKeepable(const Schedule& s, const std::string& where) {
  SendCalendar cal(s);
  auto bad = cal.UnkeepableWeekMinute(s.gap_min_hours, s.gap_max_hours);
  if (!bad) return {};
  static const char* kDays[] = {"mon", "tue", "wed", "thu", "fri", "sat", "sun"};
  char when[32];
  std::snprintf(when, sizeof when, "%s %02d:%02d", kDays[*bad / 1440], *bad % 1440 / 60, *bad % 60);
  return BadInput(where,
                  "[schedule].gap_hours = [" + std::to_string(s.gap_min_hours) + ", " +
                      std::to_string(s.gap_max_hours) + "] cannot be kept for a probe sent on " + when +
                      " UTC: no sending time lies " + std::to_string(s.gap_min_hours) + " to " +
                      std::to_string(s.gap_max_hours) + " hours later",
                  "widen the gap range, or add sending days or hours");
}

}  // namespace twinprobe
