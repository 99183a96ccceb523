// Issue 17: a decline deadline is said in the same words by `record`,
// `review`'s reminder (the same function), `schedule`, `decline` and the desk
// (collector/declines.h DeclineDeadlineWords), for every positive code.
#include <catch2/catch.hpp>

#include "collector/declines.h"
#include "core/clock.h"
#include "desk/desk_fixture.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

const std::vector<std::string> kNow = {"TWINPROBE_NOW=2027-03-10T12:00:00Z"};

}  // namespace

TEST_CASE("decline words: record, schedule and decline say the deadline of a request for information alike") {
  testing::PlannedStudy s;
  testing::SendProbes(s.path, {"P00001"}, "2027-03-01T10:00", kNow);
  const std::string words = DeclineDeadlineWords("info_request", "P00001", *ParseIsoTime("2027-03-05T10:00Z"), 24);
  CHECK(words == "decline the request for information to P00001 by 2027-03-05T10:00:00Z (within 24 hours of receipt)");

  auto record = RunCli({"--study", s.path, "record", "P00001", "info_request", "--at", "2027-03-04T10:00"}, kNow);
  REQUIRE(record.exit_code == 0);
  CHECK(record.out == "Recorded info_request for P00001 at 2027-03-04T10:00:00Z (positive callback).\n"
                      "Decline the request for information to P00001 by 2027-03-05T10:00:00Z (within 24 hours of "
                      "receipt) with the letter in " + s.path + "/ethics/letters/decline-invitation.md, then run "
                      "'twinprobe --study " + s.path + " decline P00001'.\n" +
                          testing::HeadLine(s.path));

  auto schedule = RunCli({"--study", s.path, "schedule", "--due", "2027-03-01"}, kNow);
  REQUIRE(schedule.exit_code == 0);
  CHECK(schedule.out.find("\n  overdue: " + words + "; vacancy ") != std::string::npos);

  auto decline = RunCli({"--study", s.path, "decline", "P00001", "--at", "2027-03-05T15:00"}, kNow);
  REQUIRE(decline.exit_code == 0);
  CHECK(decline.out == "Recorded that the request for information to P00001 was declined at 2027-03-05T15:00:00Z.\n"
                       "The deadline was to " +
                           words + ": missed by 5 hours.\n" + testing::HeadLine(s.path));
}

TEST_CASE("decline words: the desk's record notice and Declines page use the command's words") {
  testing::DeskStudy s;
  testing::DeskClient ada(s.url());
  ada.SignIn("Ada Moss", "meadow lantern river");
  REQUIRE(ada.Post("/today", {{"csrf", ada.csrf()}, {"probe", "P00001"}, {"sent_at", "2027-03-01T10:05"}}).status ==
          200);
  auto recorded = ada.Post("/record", {{"csrf", ada.csrf()},
                                       {"probe", "P00001"},
                                       {"code", "offer"},
                                       {"received_at", "2027-03-01T11:30"},
                                       {"channel", "phone"},
                                       {"note", ""}});
  const int64_t deadline = *ParseIsoTime("2027-03-02T11:30Z");
  CHECK(testing::ClassText(recorded.body, "notice error") ==
        DeclineReminder("offer", "P00001", deadline, 24, "mark it on the Declines page"));
  std::string sentence = DeclineDeadlineWords("offer", "P00001", deadline, 24);
  sentence[0] = 'D';
  CHECK(ada.Get("/declines").body.find("<p>" + sentence + ".</p>") != std::string::npos);
}
