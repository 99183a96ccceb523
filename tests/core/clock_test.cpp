// core/clock.h: ISO 8601 times with a UTC offset are read as UTC (issue 17,
// "only UTC times are accepted"). Expected values by hand from ISO 8601-1:2019
// section 4.3.13 (local time and UTC difference): local time minus the
// offset is UTC, and that may change the day.
#include <catch2/catch.hpp>

#include "core/clock.h"

using namespace twinprobe;

TEST_CASE("clock: an offset after a time of day is subtracted to give UTC") {
  CHECK(FormatIsoTime(ParseIsoTime("2027-03-01T09:14+01:00").value()) == "2027-03-01T08:14:00Z");
  CHECK(FormatIsoTime(ParseIsoTime("2027-03-01T09:14:30-05:30").value()) == "2027-03-01T14:44:30Z");
  CHECK(FormatIsoTime(ParseIsoTime("2027-03-01T00:30+02:00").value()) == "2027-02-28T22:30:00Z");
  CHECK(FormatIsoTime(ParseIsoTime("2027-03-01 23:00-01:00").value()) == "2027-03-02T00:00:00Z");
  CHECK(ParseIsoTime("2027-03-01T09:14+00:00") == ParseIsoTime("2027-03-01T09:14Z"));
}

TEST_CASE("clock: a bare date keeps its meaning, malformed offsets are refused") {
  CHECK(FormatIsoTime(ParseIsoTime("2027-03-01").value()) == "2027-03-01T00:00:00Z");
  CHECK_FALSE(ParseIsoTime("2027-03-01+01:00"));  // an offset needs a time of day
  CHECK_FALSE(ParseIsoTime("2027-03-01T09:14+1:00"));
  CHECK_FALSE(ParseIsoTime("2027-03-01T09:14+01"));
  CHECK_FALSE(ParseIsoTime("2027-03-01T09:14+15:00"));
  CHECK_FALSE(ParseIsoTime("2027-03-01T09:14+01:00Z"));
}
