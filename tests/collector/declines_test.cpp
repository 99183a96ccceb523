// Declines (collector/declines.h) through the real binary, as issue 17 saw
// them: a decline before the offer it declines was accepted, a second
// decline was silent, and a decline of a rejection asked for the response.
// Messages, exit codes and the unchanged store are asserted exactly.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

std::string Fingerprint(const testing::PlannedStudy& s) {
  auto store = s.Open();
  return testing::Fingerprint(*store);
}

void Run(const testing::PlannedStudy& s, const std::vector<std::string>& args) {
  std::vector<std::string> full = {"--study", s.path};
  full.insert(full.end(), args.begin(), args.end());
  auto r = RunCli(full);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
}

}  // namespace

TEST_CASE("issue 17: a decline before the offer was received is refused, the store unchanged") {
  testing::PlannedStudy s;
  Run(s, {"sent", "P00007", "--at", "2027-03-01"});
  Run(s, {"record", "P00007", "offer", "--at", "2027-03-04"});
  const std::string before = Fingerprint(s);
  auto r = RunCli({"--study", s.path, "decline", "P00007", "--at", "2027-03-01"});
  CHECK(r.exit_code == 1);
  CHECK(r.out.empty());
  CHECK(r.err == "twinprobe: the decline time 2027-03-01T00:00:00Z of P00007 is before the offer was received "
                 "(2027-03-04T00:00:00Z) \u2014 check the date; a decline answers a response already received\n");
  CHECK(Fingerprint(s) == before);
  // The same day, by date alone, is not "before" (a date alone is that whole day).
  auto same_day = RunCli({"--study", s.path, "decline", "P00007", "--at", "2027-03-04"});
  CHECK(same_day.exit_code == 0);
  CHECK(same_day.out == "Recorded that the offer to P00007 was declined at 2027-03-04T00:00:00Z.\n"
                        "The deadline was to decline the offer to P00007 by 2027-03-05T00:00:00Z (within 24 hours of "
                        "receipt): kept.\n" +
                            testing::HeadLine(s.path));
}

TEST_CASE("issue 17: a second decline is reported as already done and writes nothing") {
  testing::PlannedStudy s;
  Run(s, {"sent", "P00001", "--at", "2027-03-01"});
  Run(s, {"record", "P00001", "invitation", "--at", "2027-03-04T10:00"});
  Run(s, {"decline", "P00001", "--at", "2027-03-04T15:00"});
  const std::string before = Fingerprint(s);
  auto again = RunCli({"--study", s.path, "decline", "P00001", "--at", "2027-03-05T09:00"});
  CHECK(again.exit_code == 0);
  CHECK(again.err.empty());
  CHECK(again.out == "The invitation to P00001 was already declined at 2027-03-04T15:00:00Z; nothing recorded.\n");
  auto j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "decline", "P00001"}).out);
  CHECK(j["already_declined"] == true);
  CHECK(j["declined_at"] == "2027-03-04T15:00:00Z");
  CHECK(j["code"] == "invitation");
  CHECK(Fingerprint(s) == before);
}

TEST_CASE("issue 17: decline names a rejection as what it is and a missing response as missing") {
  testing::PlannedStudy s;
  Run(s, {"sent", "P00004", "--at", "2027-03-01"});
  Run(s, {"record", "P00004", "rejection", "--at", "2027-03-03T11:20"});
  const std::string before = Fingerprint(s);
  auto rejection = RunCli({"--study", s.path, "decline", "P00004"});
  CHECK(rejection.exit_code == 1);
  CHECK(rejection.err == "twinprobe: the current response to P00004 is 'rejection' (received 2027-03-03T11:20:00Z), "
                         "which needs no decline \u2014 only a positive response (info_request, invitation, offer) is "
                         "declined; if the employer answered again, record that first with 'twinprobe record'\n");
  auto none = RunCli({"--study", s.path, "decline", "P00005"});
  CHECK(none.exit_code == 1);
  CHECK(none.err == "twinprobe: probe 'P00005' has no response recorded, so there is nothing to decline \u2014 "
                    "record the employer's response first with 'twinprobe record'\n");
  CHECK(Fingerprint(s) == before);
}

TEST_CASE("issue 17: an info_request is declined as a request for information, times with an offset land as UTC") {
  testing::PlannedStudy s;
  Run(s, {"sent", "P00009", "--at", "2027-03-01T09:00+01:00"});
  Run(s, {"record", "P00009", "info_request", "--at", "2027-03-02T10:30+01:00"});
  auto r = RunCli({"--study", s.path, "decline", "P00009", "--at", "2027-03-02T11:00+01:00"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Recorded that the request for information to P00009 was declined at 2027-03-02T10:00:00Z.\n"
                 "The deadline was to decline the request for information to P00009 by 2027-03-03T09:30:00Z (within "
                 "24 hours of receipt): kept.\n" +
                     testing::HeadLine(s.path));
  auto store = s.Open();
  CHECK(store->QueryInt("SELECT sent_at = '2027-03-01T08:00:00Z' FROM sending") == 1);
  CHECK(store->QueryInt("SELECT received_at = '2027-03-02T09:30:00Z' FROM response") == 1);
}
