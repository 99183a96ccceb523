// Recording responses and sendings (collector/responses.h) on a real store
// planned by the real binary. Every message is asserted exactly.
#include <catch2/catch.hpp>

#include "collector/event_time.h"
#include "collector/responses.h"
#include "collector/collector_fixtures.h"

using namespace twinprobe;

namespace {

ResponseEntry Entry(const std::string& probe, const std::string& code, const std::string& at,
                    const std::string& channel = "") {
  return ResponseEntry{probe, code, at, channel, "", "record"};
}

}  // namespace

TEST_CASE("event time: a date alone is compared by day, a full time by second") {
  auto day = ParseEventTime("2027-03-04").value();
  auto morning = ParseEventTime("2027-03-04T09:14").value();
  auto evening = ParseEventTime("2027-03-04 18:00:05").value();
  CHECK(day.date_only);
  CHECK_FALSE(morning.date_only);
  CHECK(day.text() == "2027-03-04T00:00:00Z");
  CHECK(evening.text() == "2027-03-04T18:00:05Z");
  CHECK_FALSE(IsBefore(day, morning));  // a response dated the sending day is not before it
  CHECK_FALSE(IsBefore(morning, day));
  CHECK(IsBefore(morning, evening));
  CHECK(IsBefore(ParseEventTime("2027-03-03").value(), morning));
  CHECK(IsAfterWindow(morning, ParseEventTime("2027-04-01T09:15").value(), 28));
  CHECK_FALSE(IsAfterWindow(morning, ParseEventTime("2027-04-01T09:14").value(), 28));
  CHECK_FALSE(IsAfterWindow(morning, ParseEventTime("2027-04-01").value(), 28));
  CHECK(IsAfterWindow(morning, ParseEventTime("2027-04-02").value(), 28));
  CHECK(DaysBetween(morning, ParseEventTime("2027-04-02").value()) == 29);
  CHECK_FALSE(ParseEventTime("2027-02-29"));
  CHECK_FALSE(ParseEventTime("04/03/2027"));
  for (const char* text : {"2027-03-04", "2027-03-04Z", "2027-03-04T09:14", "2027-03-04 09:14", "2027-03-04T09:14:07Z",
                           "2027-03-04T09:14Z", "2027-03-04T09:14+01:00", "2027-03-04T00:14:07+02:00",
                           "2027-03-04T23:14-03:30"})
    CHECK(CanonicalEventText(text) == ParseEventTime(text)->text());
}

TEST_CASE("record: unknown probe, code, channel and time are refused with exact messages") {
  testing::PlannedStudy s;
  auto store = s.Open();
  OutcomeScheme scheme;
  const std::string before = testing::Fingerprint(*store);
  auto unknown = RecordResponse(*store, scheme, Entry("P99999", "invitation", "2027-03-04"));
  CHECK(unknown.error().Message() ==
        "unknown probe 'P99999' \u2014 use a probe reference from 'twinprobe schedule' or the plan (e.g. P00001)");
  auto code = RecordResponse(*store, scheme, Entry("P00001", "invitaton", "2027-03-04"));
  CHECK(code.error().Message() == "'invitaton' is not a response code of this study (did you mean 'invitation'?) "
                                  "\u2014 use one of: none, rejection, info_request, invitation, offer");
  auto channel = RecordResponse(*store, scheme, Entry("P00001", "invitation", "2027-03-04", "fax"));
  CHECK(channel.error().Message() == "unknown channel 'fax' \u2014 use mail, phone, letter or other");
  auto near = RecordResponse(*store, scheme, Entry("P00001", "invitation", "2027-03-04", "phon"));
  CHECK(near.error().Message() == "unknown channel 'phon' (did you mean 'phone'?) \u2014 use mail, phone, letter or other");
  auto when = RecordResponse(*store, scheme, Entry("P00001", "invitation", "2027-02-30"));
  CHECK(when.error().Message() == "'2027-02-30' is not a date or time \u2014 write it as YYYY-MM-DD or "
                                  "YYYY-MM-DDTHH:MM (UTC)");
  CHECK(testing::Fingerprint(*store) == before);
}

TEST_CASE("record: a response before the sending is refused, on the sending day by date it is accepted") {
  testing::PlannedStudy s;
  auto store = s.Open();
  OutcomeScheme scheme;
  REQUIRE(RecordSending(*store, "P00001", "2027-03-04T09:14").ok());
  auto early = RecordResponse(*store, scheme, Entry("P00001", "rejection", "2027-03-04T09:00"));
  CHECK(early.error().Message() == "the response time 2027-03-04T09:00:00Z of P00001 is before its sending "
                                   "(2027-03-04T09:14:00Z) \u2014 check the date; if the sending time is wrong, "
                                   "correct it first with 'twinprobe sent P00001 --at TIME'");
  auto day_before = RecordResponse(*store, scheme, Entry("P00001", "rejection", "2027-03-03"));
  CHECK(day_before.error().what == "the response time 2027-03-03T00:00:00Z of P00001 is before its sending "
                                   "(2027-03-04T09:14:00Z)");
  auto same_day = RecordResponse(*store, scheme, Entry("P00001", "rejection", "2027-03-04"));
  REQUIRE(same_day.ok());
  CHECK(same_day.value().received_at == "2027-03-04T00:00:00Z");
  CHECK_FALSE(same_day.value().late);
  CHECK(same_day.value().sent_at == "2027-03-04T09:14:00Z");
}

TEST_CASE("record: outside the observation window is stored with the flag 'late'") {
  testing::PlannedStudy s;
  auto store = s.Open();
  OutcomeScheme scheme;  // window 28 days
  REQUIRE(RecordSending(*store, "P00001", "2027-03-01T09:00").ok());
  auto in = RecordResponse(*store, scheme, Entry("P00001", "invitation", "2027-03-29T09:00"));
  REQUIRE(in.ok());
  CHECK_FALSE(in.value().late);
  auto late = RecordResponse(*store, scheme, Entry("P00001", "invitation", "2027-03-29T09:01"));
  REQUIRE(late.ok());
  CHECK(late.value().late);
  CHECK(late.value().days_after_sending == 28);
  CHECK(store->QueryInt("SELECT count(*) FROM response WHERE flags = 'late'") == 1);
}

TEST_CASE("issue 17: a response to a probe with no sending is refused by every writer, the store unchanged") {
  testing::PlannedStudy s;
  auto store = s.Open();
  OutcomeScheme scheme;
  const std::string message =
      "P00002 has no sending recorded, so no response to it can have come \u2014 record the sending first with "
      "'twinprobe sent P00002 --at TIME' (or 'twinprobe import sendings FILE.csv' for many)";
  const int64_t audit_before = store->QueryInt("SELECT count(*) FROM audit");
  auto recorded = RecordResponse(*store, scheme, Entry("P00002", "rejection", "2027-03-05"));
  REQUIRE_FALSE(recorded.ok());
  CHECK(recorded.error().Message() == message);
  // The writer the importers and the demo share has no way around it either.
  ResponseWriter writer(*store, scheme, 0, "test", "2027-04-26T14:59:00Z");
  auto added = writer.Add(Entry("P00002", "rejection", "2027-03-05"), "");
  REQUIRE_FALSE(added.ok());
  CHECK(added.error().Message() == message);
  CHECK(store->QueryInt("SELECT count(*) FROM response") == 0);
  CHECK(store->QueryInt("SELECT count(*) FROM audit") == audit_before);
}

TEST_CASE("record: corrections never overwrite, each new response supersedes the current one") {
  testing::PlannedStudy s;
  auto store = s.Open();
  OutcomeScheme scheme;
  REQUIRE(RecordSending(*store, "P00003", "2027-03-02").ok());
  auto first = RecordResponse(*store, scheme, Entry("P00003", "rejection", "2027-03-04"));
  auto second = RecordResponse(*store, scheme, Entry("P00003", "invitation", "2027-03-04"));
  auto third = RecordResponse(*store, scheme, Entry("P00003", "offer", "2027-03-10"));
  REQUIRE((first.ok() && second.ok() && third.ok()));
  CHECK(first.value().superseded == 0);
  CHECK(second.value().superseded == first.value().response_id);
  CHECK(third.value().superseded == second.value().response_id);
  CHECK(store->QueryInt("SELECT count(*) FROM response WHERE probe_id = (SELECT id FROM probe WHERE ref = 'P00003')") == 3);
  CHECK(store->QueryInt("SELECT code = 'offer' FROM current_response WHERE probe_id = "
                        "(SELECT id FROM probe WHERE ref = 'P00003')") == 1);
  CHECK(store->QueryInt("SELECT count(*) FROM audit WHERE command = 'record'") == 3);
  CHECK(VerifyAudit(*store).ok());
}

TEST_CASE("sent: a later sending replaces the time but keeps the earlier row, it cannot follow the response") {
  testing::PlannedStudy s;
  auto store = s.Open();
  OutcomeScheme scheme;
  auto a = RecordSending(*store, "P00004", "2027-03-01");
  REQUIRE(a.ok());
  CHECK(a.value().sent_at == "2027-03-01T00:00:00Z");
  CHECK(a.value().previous_sent_at.empty());
  auto b = RecordSending(*store, "P00004", "2027-03-02T10:00");
  REQUIRE(b.ok());
  CHECK(b.value().previous_sent_at == "2027-03-01T00:00:00Z");
  REQUIRE(RecordResponse(*store, scheme, Entry("P00004", "rejection", "2027-03-05")).ok());
  auto c = RecordSending(*store, "P00004", "2027-03-06");
  CHECK(c.error().Message() == "P00004 already has a response received 2027-03-05T00:00:00Z, before "
                               "2027-03-06T00:00:00Z \u2014 check the date; a probe is sent before it is answered");
  CHECK(RecordSending(*store, "P0004", "").error().Message() ==
        "unknown probe 'P0004' \u2014 use a probe reference from 'twinprobe schedule'");
  CHECK(RecordSending(*store, "P00004", "March 1").error().Message() ==
        "'March 1' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
  CHECK(store->QueryInt("SELECT count(*) FROM sending") == 2);
}
