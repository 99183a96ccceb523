#include <catch2/catch.hpp>

#include "core/clock.h"
#include "planner/send_calendar.h"

using namespace twinprobe;

namespace {

Schedule Weekdays9to17() {
  Schedule s;
  s.weekdays = {0, 1, 2, 3, 4};
  s.hour_open = 9;
  s.hour_close = 17;
  return s;
}

int64_t Minute(const char* iso) { return *ParseIsoTime(iso) / 60; }

}  // namespace

TEST_CASE("send calendar: open minutes of a week and across a weekend") {
  SendCalendar cal(Weekdays9to17());
  // 2027-03-01 is a Monday. A whole week holds 5 x 8 hours.
  CHECK(cal.OpenMinutes(Minute("2027-03-01"), Minute("2027-03-08") - 1) == 5 * 8 * 60);
  CHECK(cal.OpenMinutes(Minute("2027-03-05T16:00"), Minute("2027-03-08T09:59")) == 60 + 60);
  CHECK(cal.IsOpen(Minute("2027-03-01T09:00")));
  CHECK_FALSE(cal.IsOpen(Minute("2027-03-01T17:00")));
  CHECK_FALSE(cal.IsOpen(Minute("2027-03-06T10:00")));  // Saturday
  CHECK(cal.NthOpenMinute(Minute("2027-03-05T16:30"), 30) == Minute("2027-03-08T09:00"));
  CHECK(cal.NthOpenMinute(Minute("2027-03-06T00:00"), 0) == Minute("2027-03-08T09:00"));
}

TEST_CASE("send calendar: sending days skip closed days") {
  SendCalendar cal(Weekdays9to17());
  CHECK(FormatIsoDate(cal.SendingDayOnOrAfter(*ParseIsoTime("2027-03-06T12:00"))) == "2027-03-08");
  CHECK(FormatIsoDate(cal.NextSendingDay(*ParseIsoTime("2027-03-05"))) == "2027-03-08");
  CHECK(FormatIsoDate(cal.SendingDayOnOrAfter(*ParseIsoTime("2027-03-03"))) == "2027-03-03");
}

TEST_CASE("send calendar: draws stay in the sending hours and in the gap range") {
  Schedule s = Weekdays9to17();
  s.gap_min_hours = 20;
  s.gap_max_hours = 90;
  SendCalendar cal(s);
  stats::Rng rng(42);
  int64_t day = *ParseIsoTime("2027-03-01");
  for (int i = 0; i < 2000; ++i) {
    int64_t first = cal.DrawTimeOnDay(day, rng);
    REQUIRE(cal.IsOpen(first));
    REQUIRE(first * 60 / 86400 * 86400 == day);
    auto next = cal.DrawAfterGap(first, s.gap_min_hours, s.gap_max_hours, rng);
    REQUIRE(next);
    REQUIRE(cal.IsOpen(*next));
    REQUIRE(*next - first >= 20 * 60);
    REQUIRE(*next - first <= 90 * 60);
    day = cal.NextSendingDay(day);
  }
}

TEST_CASE("send calendar: a gap range that cannot be kept is named with the day and time") {
  Schedule s = Weekdays9to17();
  s.gap_min_hours = 24;
  s.gap_max_hours = 30;
  Status st = CheckGapsKeepable(s, "study.toml:44:13");
  REQUIRE_FALSE(st.ok());
  CHECK(st.error().Message() ==
        "study.toml:44:13: [schedule].gap_hours = [24, 30] cannot be kept for a probe sent on fri 09:00 UTC: no sending "
        "time lies 24 to 30 hours later \u2014 widen the gap range, or add sending days or hours");
  // From Friday 09:00 plus 24 h the next open minute is Monday 09:00, 72 h
  // after the probe: the default [24, 72] is the narrowest range from 24 h.
  s.gap_max_hours = 72;
  CHECK(CheckGapsKeepable(s, "x").ok());
  s.gap_max_hours = 71;
  st = CheckGapsKeepable(s, "x");
  REQUIRE_FALSE(st.ok());
  CHECK(st.error().what.find("sent on fri 09:00 UTC") != std::string::npos);
}
