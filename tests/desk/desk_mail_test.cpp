// The desk's Mail page over real HTTP: the review queue and decisions,
// through the same function and with the same messages as `review`.
#include <catch2/catch.hpp>

#include "collector/history.h"
#include "collector/mail_fixture.h"
#include "desk/desk_fixture.h"

using namespace twinprobe;
using testing::ClassText;
using testing::DeskClient;

TEST_CASE("desk mail: a suggestion confirmed on the desk lands under the member's name, refusals change nothing") {
  mailtest::PlannedMailStudy s;
  REQUIRE(testing::RunCli({"--study", s.study, "mail"}).exit_code == 0);
  s.SendAll();
  testing::ServedDesk desk(testing::WithTeam(s.study), "2027-03-06T12:00:00Z");
  DeskClient ada(desk.url());
  ada.SignIn("Ada Moss", "meadow lantern river");

  auto queue = ada.Get("/mail");
  CHECK(queue.status == 200);
  CHECK(queue.body.find("12 messages wait for a decision") != std::string::npos);
  CHECK(queue.body.find(
            "<bdi>invitation</bdi>: \u201c<bdi>invite you to an interview</bdi>\u201d in the <bdi>body</bdi>") !=
        std::string::npos);

  const std::string before = testing::FingerprintOf(s.study + "/study.db");
  auto no_decision = ada.Post("/mail", {{"csrf", ada.csrf()}, {"message", "1"}});
  CHECK(no_decision.status == 400);
  CHECK(ClassText(no_decision.body, "refused") == "choose a decision \u2014 confirm, code or dismiss");
  auto ambiguous =
      ada.Post("/mail", {{"csrf", ada.csrf()}, {"message", "10"}, {"decision-10", "code"}, {"code-10", "rejection"}});
  CHECK(ambiguous.status == 400);
  CHECK(ambiguous.body.find("id=\"decision-10-refused\"") != std::string::npos);
  CHECK(testing::FingerprintOf(s.study + "/study.db") == before);

  auto confirmed =
      ada.Post("/mail", {{"csrf", ada.csrf()}, {"message", "1"}, {"decision-1", "confirm"}, {"probe-1", "P00001"}});
  CHECK(confirmed.status == 200);
  CHECK(ClassText(confirmed.body, "notice ok") ==
        "Recorded invitation for P00001 at 2027-03-04T09:15:00Z from message 1 (confirmed as suggested), a positive "
        "callback.");
  CHECK(confirmed.body.find("11 messages wait for a decision") != std::string::npos);
  auto dismissed = ada.Post("/mail", {{"csrf", ada.csrf()}, {"message", "11"}, {"decision-11", "dismiss"}});
  CHECK(ClassText(dismissed.body, "notice ok") == "Dismissed message 11; no response was recorded.");

  auto store = s.Open();
  auto h = LoadHistory(*store, OutcomeScheme{}, "P00001");
  REQUIRE(h.ok());
  REQUIRE(h.value().current_response >= 0);
  const HistoryEvent& e = h.value().events[static_cast<size_t>(h.value().current_response)];
  CHECK(e.code == "invitation");
  CHECK(e.origin == "mail-review");
  CHECK(e.entered_by == "Ada Moss");
  CHECK(store->QueryInt("SELECT count(*) FROM review_decision") == 2);
}
