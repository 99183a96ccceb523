// The declines of positive responses (analysis/declines.h): counted by hand
// from the definitions, at the edges of the deadline.
#include <catch2/catch.hpp>

#include "analysis/declines.h"
#include "core/clock.h"

using namespace twinprobe;

namespace {

DeclineFact Fact(const std::string& probe, const std::string& code, const std::string& received,
                 const std::string& declined) {
  return DeclineFact{probe, "V0001", 0, code, received, declined};
}

DeclineReading Reading(int hours) {
  DeclineReading r;
  r.decline_within_hours = hours;
  r.responses = {
      Fact("P00001", "invitation", "2027-03-01T10:00:00Z", "2027-03-02T09:00:00Z"),    // on time
      Fact("P00002", "offer", "2027-03-01T10:00:00Z", "2027-03-03T10:00:01Z"),         // one second late
      Fact("P00003", "info_request", "2027-03-01T10:00:00Z", "2027-03-03T10:00:00Z"),  // at the deadline: on time
      Fact("P00004", "invitation", "2027-03-01T10:00:00Z", ""),                        // not declined
      Fact("P00005", "rejection", "2027-03-01T10:00:00Z", ""),                         // not positive
      Fact("P00006", "invitation", "", ""),                                            // no time: no deadline
  };
  return r;
}

}  // namespace

TEST_CASE("declines: on time, late, and a deadline at the study clock has not passed") {
  OutcomeScheme scheme;  // positive: info_request, invitation, offer
  // 48 hours after 2027-03-01T10:00:00Z is 2027-03-03T10:00:00Z.
  const int64_t deadline = *ParseIsoTime("2027-03-03T10:00:00Z");
  DeclineCounts at = CountDeclines(Reading(48), scheme, deadline);
  CHECK(at.present);
  CHECK(at.rule == "within 48 hours of receipt");
  CHECK(at.positive == 5);
  CHECK(at.due == 4);
  CHECK(at.on_time == 2);
  CHECK(at.late == 1);
  CHECK(at.missing == 0);
  CHECK(at.within == 1);
  DeclineCounts after = CountDeclines(Reading(48), scheme, deadline + 1);
  CHECK(after.missing == 1);
  CHECK(after.within == 0);
  CHECK(after.due == after.on_time + after.late + after.missing + after.within);
}

TEST_CASE("declines: a plan with no deadline has nothing due, a study without positive responses no section") {
  OutcomeScheme scheme;
  DeclineCounts none = CountDeclines(Reading(0), scheme, *ParseIsoTime("2027-04-01T00:00:00Z"));
  CHECK(none.present);
  CHECK(none.positive == 5);
  CHECK(none.due == 0);
  CHECK(none.rule.empty());
  DeclineReading rejections;
  rejections.decline_within_hours = 24;
  rejections.responses = {Fact("P00001", "rejection", "2027-03-01T10:00:00Z", "")};
  CHECK_FALSE(CountDeclines(rejections, scheme, 0).present);
}
