#include "core/clock.h"

#include <chrono>
#include <cstdio>
#include <cstdlib>

namespace twinprobe {
namespace {

// Days since 1970-01-01 for a proleptic Gregorian date (H. Hinnant's algorithm).
int64_t DaysFromCivil(int64_t y, unsigned m, unsigned d) {
  y -= m <= 2;
  const int64_t era = (y >= 0 ? y : y - 399) / 400;
  const unsigned yoe = static_cast<unsigned>(y - era * 400);
  const unsigned doy = (153 * (m + (m > 2 ? -3 : 9)) + 2) / 5 + d - 1;
  const unsigned doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
  return era * 146097 + static_cast<int64_t>(doe) - 719468;
}

void CivilFromDays(int64_t z, int& y, unsigned& m, unsigned& d) {
  z += 719468;
  const int64_t era = (z >= 0 ? z : z - 146096) / 146097;
  const unsigned doe = static_cast<unsigned>(z - era * 146097);
  const unsigned yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
  const int64_t yy = static_cast<int64_t>(yoe) + era * 400;
  const unsigned doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
  const unsigned mp = (5 * doy + 2) / 153;
  d = doy - (153 * mp + 2) / 5 + 1;
  m = mp + (mp < 10 ? 3 : -9);
  y = static_cast<int>(yy + (m <= 2));
}

bool Digits(std::string_view s, size_t pos, size_t n, int& out) {
  if (pos + n > s.size()) return false;
  out = 0;
  for (size_t i = pos; i < pos + n; ++i) {
    if (s[i] < '0' || s[i] > '9') return false;
    out = out * 10 + (s[i] - '0');
  }
  return true;
}

}  // namespace

std::string NowIso() {
  if (const char* pinned = std::getenv("TWINPROBE_NOW")) {
    if (auto t = ParseIsoTime(pinned)) return FormatIsoTime(*t);
  }
  return FormatIsoTime(NowEpoch());
}

int64_t NowEpoch() {
  if (const char* pinned = std::getenv("TWINPROBE_NOW")) {
    if (auto t = ParseIsoTime(pinned)) return *t;
  }
  return std::chrono::duration_cast<std::chrono::seconds>(
             std::chrono::system_clock::now().time_since_epoch())
      .count();
}

namespace {

// The calendar reading without the range check (WhyNotATime tells the two
// refusals apart).
std::optional<int64_t> ParseIsoTimeAnyYear(std::string_view s) {
  int y, mo, d, h = 0, mi = 0, se = 0;
  if (!Digits(s, 0, 4, y) || s.size() < 10 || s[4] != '-' || !Digits(s, 5, 2, mo) || s[7] != '-' ||
      !Digits(s, 8, 2, d))
    return std::nullopt;
  size_t pos = 10;
  if (pos < s.size() && (s[pos] == 'T' || s[pos] == ' ')) {
    if (!Digits(s, pos + 1, 2, h) || pos + 3 >= s.size() || s[pos + 3] != ':' || !Digits(s, pos + 4, 2, mi))
      return std::nullopt;
    pos += 6;
    if (pos < s.size() && s[pos] == ':') {
      if (!Digits(s, pos + 1, 2, se)) return std::nullopt;
      pos += 3;
    }
  }
  // A time of day may carry its UTC offset ("09:14+01:00", ISO 8601 section
  // 4.2.5.1): field teams in other time zones write local time, and the
  // store keeps UTC, so the offset is subtracted below.
  int offset_seconds = 0;
  if (pos < s.size() && s[pos] == 'Z') {
    ++pos;
  } else if (pos > 10 && pos < s.size() && (s[pos] == '+' || s[pos] == '-')) {
    int oh, om;
    if (!Digits(s, pos + 1, 2, oh) || pos + 3 >= s.size() || s[pos + 3] != ':' || !Digits(s, pos + 4, 2, om) ||
        oh > 14 || om > 59)
      return std::nullopt;
    offset_seconds = (s[pos] == '+' ? 1 : -1) * (oh * 3600 + om * 60);
    pos += 6;
  }
  if (pos != s.size()) return std::nullopt;
  static const int kDaysIn[] = {31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  if (mo < 1 || mo > 12 || d < 1 || d > kDaysIn[mo - 1] || h > 23 || mi > 59 || se > 59) return std::nullopt;
  bool leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
  if (mo == 2 && d == 29 && !leap) return std::nullopt;
  return DaysFromCivil(y, static_cast<unsigned>(mo), static_cast<unsigned>(d)) * 86400 + h * 3600 + mi * 60 + se -
         offset_seconds;
}

}  // namespace

std::optional<int64_t> ParseIsoTime(std::string_view s) {
  auto t = ParseIsoTimeAnyYear(s);
  if (!t || *t < kEarliestTime || *t > kLatestTime) return std::nullopt;
  return t;
}

std::string WhyNotATime(std::string_view text, std::string_view usual) {
  if (auto t = ParseIsoTimeAnyYear(text); t && (*t < kEarliestTime || *t > kLatestTime))
    return "is outside the accepted range " + std::string(kAcceptedTimeRange);
  return std::string(usual);
}

std::string FormatIsoTime(int64_t t) {
  int64_t days = t >= 0 ? t / 86400 : (t - 86399) / 86400;
  int64_t secs = t - days * 86400;
  int y;
  unsigned m, d;
  CivilFromDays(days, y, m, d);
  char buf[32];
  std::snprintf(buf, sizeof buf, "%04d-%02u-%02uT%02d:%02d:%02dZ", y, m, d, static_cast<int>(secs / 3600),
                static_cast<int>(secs / 60 % 60), static_cast<int>(secs % 60));
  return buf;
}

std::string FormatIsoDate(int64_t t) { return FormatIsoTime(t).substr(0, 10); }

int WeekdayOf(int64_t t) {
  int64_t days = t >= 0 ? t / 86400 : (t - 86399) / 86400;
  // 1970-01-01 was a Thursday (3 when Monday is 0).
  return static_cast<int>(((days % 7) + 7 + 3) % 7);
}

}  // namespace twinprobe
