// The plausible-time rules (collector/time_rules.h) on plain values: each
// refusal's exact words, and the edges (clock skew, a date alone, the
// schedule's start less early_days).
#include <catch2/catch.hpp>

#include "collector/time_rules.h"
#include "core/clock.h"

using namespace twinprobe;

namespace {

EventTime At(const char* text) { return ParseEventTime(text).value(); }

TimeRules Rules() {
  TimeRules r;
  r.now = ParseIsoTime("2027-03-10T12:00:00Z").value();
  r.schedule_start = ParseIsoTime("2027-03-01T09:00:00Z").value();
  r.early_days = 1;
  return r;
}

std::string Refusal(const TimedFact& f) {
  Status s = CheckPlausibleTime(Rules(), f, "");
  return s.ok() ? "accepted" : s.error().Message();
}

}  // namespace

TEST_CASE("issue 17: a sending years in the future is refused, naming the probe, both times and the fix") {
  CHECK(Refusal({TimedEvent::kSending, "P00013", At("2031-01-01"), std::nullopt, ""}) ==
        "the sending time 2031-01-01T00:00:00Z of P00013 is in the future (now is 2027-03-10T12:00:00Z) \u2014 check "
        "the date; record an event once it has happened");
}

TEST_CASE("time rules: a clock up to ten minutes ahead is allowed, a date alone is in the future only as a whole day") {
  CHECK(Refusal({TimedEvent::kResponse, "P00002", At("2027-03-10T12:10"), std::nullopt, ""}) == "accepted");
  CHECK(Refusal({TimedEvent::kResponse, "P00002", At("2027-03-10T12:11"), std::nullopt, ""}) ==
        "the response time 2027-03-10T12:11:00Z of P00002 is in the future (now is 2027-03-10T12:00:00Z) \u2014 "
        "check the date; record an event once it has happened");
  CHECK(Refusal({TimedEvent::kResponse, "P00002", At("2027-03-10"), std::nullopt, ""}) == "accepted");
  CHECK(Refusal({TimedEvent::kResponse, "P00002", At("2027-03-11"), std::nullopt, ""}) ==
        "the response time 2027-03-11T00:00:00Z of P00002 is in the future (now is 2027-03-10T12:00:00Z) \u2014 "
        "check the date; record an event once it has happened");
}

TEST_CASE("issue 17: a sending three months before the schedule's start is refused, early_days allows a little") {
  CHECK(Refusal({TimedEvent::kSending, "P00023", At("2026-12-01"), std::nullopt, ""}) ==
        "the sending time 2026-12-01T00:00:00Z of P00023 is before the schedule starts (2027-03-01T09:00:00Z, less "
        "[schedule] early_days = 1) \u2014 check the date; if the applications really left earlier, raise [schedule] "
        "early_days in study.toml");
  // One day before the start is allowed; a date alone counts as that whole day.
  CHECK(Refusal({TimedEvent::kSending, "P00023", At("2027-02-28T09:00"), std::nullopt, ""}) == "accepted");
  CHECK(Refusal({TimedEvent::kSending, "P00023", At("2027-02-28"), std::nullopt, ""}) == "accepted");
  CHECK(Refusal({TimedEvent::kSending, "P00023", At("2027-02-28T08:59"), std::nullopt, ""}).substr(0, 80) ==
        "the sending time 2027-02-28T08:59:00Z of P00023 is before the schedule starts (2");
  // Responses and declines are not held to the schedule.
  CHECK(Refusal({TimedEvent::kResponse, "P00023", At("2026-12-01"), std::nullopt, ""}) == "accepted");
  TimeRules unplanned = Rules();
  unplanned.schedule_start.reset();
  CHECK(CheckPlausibleTime(unplanned, {TimedEvent::kSending, "P00023", At("2026-12-01"), std::nullopt, ""}, "").ok());
}

TEST_CASE("time rules: years outside 1970-2200 are refused with the range, before any other rule") {
  // (Before 1900 a text is no time at all: core/clock's parser refuses it first.)
  CHECK(Refusal({TimedEvent::kSending, "P00001", At("1950-03-01"), std::nullopt, ""}) ==
        "the sending time 1950-03-01T00:00:00Z of P00001 is in the year 1950, outside 1970\u20132200 \u2014 check "
        "the year; write the time as YYYY-MM-DD or YYYY-MM-DDTHH:MM");
  CHECK(Refusal({TimedEvent::kDecline, "P00001", At("2201-01-01"), std::nullopt, "offer"}) ==
        "the decline time 2201-01-01T00:00:00Z of P00001 is in the year 2201, outside 1970\u20132200 \u2014 check "
        "the year; write the time as YYYY-MM-DD or YYYY-MM-DDTHH:MM");
  TimeRules far = Rules();
  far.now = ParseIsoTime("2200-12-31T23:59:59Z").value();
  CHECK(CheckPlausibleTime(far, {TimedEvent::kResponse, "P00001", At("2200-12-31"), std::nullopt, ""}, "").ok());
  CHECK(CheckPlausibleTime(far, {TimedEvent::kResponse, "P00001", At("1970-01-01"), std::nullopt, ""}, "").ok());
  CHECK_FALSE(CheckPlausibleTime(far, {TimedEvent::kResponse, "P00001", At("1969-12-31"), std::nullopt, ""}, "").ok());
}

TEST_CASE("time rules: a response before its sending and a decline before its response are refused at the row") {
  CHECK(CheckPlausibleTime(Rules(), {TimedEvent::kResponse, "P00002", At("2027-03-03"), At("2027-03-04T10:00"), ""},
                           "in.csv:3")
            .error()
            .Message() ==
        "in.csv:3: the response time 2027-03-03T00:00:00Z of P00002 is before its sending (2027-03-04T10:00:00Z) "
        "\u2014 check the date; if the sending time is wrong, correct it first with 'twinprobe sent P00002 --at "
        "TIME'");
  // By day when either is a date alone: the sending day itself is not before.
  CHECK(Refusal({TimedEvent::kResponse, "P00002", At("2027-03-04"), At("2027-03-04T10:00"), ""}) == "accepted");
  CHECK(Refusal({TimedEvent::kDecline, "P00007", At("2027-03-01"), At("2027-03-04"), "offer"}) ==
        "the decline time 2027-03-01T00:00:00Z of P00007 is before the offer was received (2027-03-04T00:00:00Z) "
        "\u2014 check the date; a decline answers a response already received");
}
