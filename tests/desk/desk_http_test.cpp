// The desk over real HTTP on 127.0.0.1 (libcurl as the browser): sign-in,
// entries attributed to the member, refusals with the command's message and
// an unchanged store, CSRF, escaping and the body cap.
#include <catch2/catch.hpp>

#include "collector/history.h"
#include "core/audit.h"
#include "core/desk_passphrases.h"
#include "desk/desk_fixture.h"

using namespace twinprobe;
using testing::ClassText;
using testing::DeskClient;
using testing::DeskStudy;

TEST_CASE("desk http: a first sign-in sets a passphrase and the entries land under the member's name") {
  DeskStudy s;
  DeskClient ada(s.url());
  CHECK(ada.Get("/today").location == "/signin");
  ada.SignIn("Ada Moss", "meadow lantern river");
  {
    auto store = s.study.Open();
    auto stored = ReadPassphrase(*store, "Ada Moss");
    REQUIRE(stored);
    CHECK(stored->hash_hex.find("meadow") == std::string::npos);
    CHECK(store->QueryInt("SELECT count(*) FROM audit WHERE command = 'desk passphrase' AND actor = 'Ada Moss'") == 1);
  }
  auto sent = ada.Post(
      "/today", {{"csrf", ada.csrf()}, {"probe", "P00001"}, {"probe", "P00003"}, {"sent_at", "2027-03-01T10:05"}});
  CHECK(sent.status == 200);
  CHECK(ClassText(sent.body, "notice ok") ==
        "Marked P00001 as sent at 2027-03-01T10:05:00Z. Marked P00003 as sent at 2027-03-01T10:05:00Z.");
  auto recorded = ada.Post("/record", {{"csrf", ada.csrf()},
                                       {"probe", "P00001"},
                                       {"code", "invitation"},
                                       {"received_at", "2027-03-01T11:30"},
                                       {"channel", "phone"},
                                       {"note", "call back"}});
  CHECK(recorded.status == 200);
  CHECK(ClassText(recorded.body, "notice ok") ==
        "Recorded invitation for P00001 at 2027-03-01T11:30:00Z (positive callback).");
  auto corrected = ada.Post("/record", {{"csrf", ada.csrf()},
                                        {"probe", "P00001"},
                                        {"code", "rejection"},
                                        {"received_at", "2027-03-01T11:30"},
                                        {"channel", "phone"},
                                        {"note", ""}});
  CHECK(ClassText(corrected.body, "notice ok") ==
        "Recorded rejection for P00001 at 2027-03-01T11:30:00Z; it supersedes response 1, which is kept.");
  CHECK(corrected.body.find("superseded by response 2") != std::string::npos);

  auto store = s.study.Open();
  auto h = LoadHistory(*store, OutcomeScheme{}, "P00001");
  REQUIRE(h.ok());
  REQUIRE(h.value().events.size() == 3);
  for (const HistoryEvent& e : h.value().events) CHECK(e.entered_by == "Ada Moss");
  CHECK(h.value().events[1].origin == "desk");
  CHECK(h.value().events[1].superseded_by == h.value().events[2].id);
  CHECK(store->QueryInt("SELECT count(*) FROM audit WHERE actor = 'Ada Moss'") == 5);  // passphrase, 2 sent, 2 record
  CHECK(VerifyAudit(*store).ok());
}

TEST_CASE("desk http: a refused response shows record's message beside its field and changes nothing") {
  DeskStudy s;
  DeskClient ada(s.url());
  ada.SignIn("Ada Moss", "meadow lantern river");
  const std::string before = testing::FingerprintOf(s.study.db());
  auto r = ada.Post("/record", {{"csrf", ada.csrf()},
                                {"probe", "P00002"},
                                {"code", "invitation"},
                                {"received_at", "yesterday"},
                                {"channel", ""},
                                {"note", ""}});
  CHECK(r.status == 400);
  CHECK(ClassText(r.body, "refused") ==
        "'yesterday' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
  CHECK(r.body.find("id=\"received_at\" name=\"received_at\" value=\"yesterday\" autocomplete=\"off\" "
                    "aria-describedby=\"received_at-hint received_at-refused\" aria-invalid=\"true\"") !=
        std::string::npos);
  auto code = ada.Post("/record", {{"csrf", ada.csrf()}, {"probe", "P00002"}, {"code", "invitaton"}});
  CHECK(ClassText(code.body, "refused") ==
        "'invitaton' is not a response code of this study (did you mean 'invitation'?) \u2014 use one of: none, "
        "rejection, info_request, invitation, offer");
  CHECK(code.body.find("id=\"code-refused\"") != std::string::npos);
  // Issue 17: a response needs a sending, on the desk as in `record`.
  auto unsent = ada.Post("/record", {{"csrf", ada.csrf()},
                                     {"probe", "P00002"},
                                     {"code", "invitation"},
                                     {"received_at", "2027-03-05"},
                                     {"channel", ""},
                                     {"note", ""}});
  CHECK(unsent.status == 400);
  CHECK(ClassText(unsent.body, "notice error") ==
        "Nothing was recorded: P00002 has no sending recorded, so no response to it can have come \u2014 record the "
        "sending first with 'twinprobe sent P00002 --at TIME' (or 'twinprobe import sendings FILE.csv' for many)");
  auto sent = ada.Post("/today", {{"csrf", ada.csrf()}, {"probe", "P00001"}, {"sent_at", "soon"}});
  CHECK(sent.status == 400);
  CHECK(ClassText(sent.body, "refused") ==
        "'soon' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
  auto decline = ada.Post("/declines", {{"csrf", ada.csrf()}, {"probe", "P00002"}});
  CHECK(ClassText(decline.body, "notice error") ==
        "probe 'P00002' has no response recorded, so there is nothing to decline \u2014 record the employer's response first with "
        "'twinprobe record'");
  CHECK(testing::FingerprintOf(s.study.db()) == before);
}

TEST_CASE("desk http: a form without its CSRF token or from a signed-out browser is refused") {
  DeskStudy s;
  DeskClient ada(s.url());
  ada.SignIn("Ada Moss", "meadow lantern river");
  const std::string before = testing::FingerprintOf(s.study.db());
  auto forged = ada.Post("/record", {{"probe", "P00001"}, {"code", "invitation"}});
  CHECK(forged.status == 403);
  CHECK(ClassText(forged.body, "notice error") ==
        "This form did not come from this desk (its security token is missing or wrong); nothing was recorded. Open "
        "the page again and resend.");
  CHECK(ada.Post("/record", {{"csrf", std::string(64, '0')}, {"probe", "P00001"}, {"code", "invitation"}}).status ==
        403);
  DeskClient stranger(s.url());
  auto r = stranger.Post("/record", {{"csrf", ada.csrf()}, {"probe", "P00001"}, {"code", "invitation"}});
  CHECK(r.status == 403);
  CHECK(ClassText(r.body, "notice error") == "Your session has ended. Sign in again; nothing was recorded.");
  // A sign-in form posted without the token its page set.
  CHECK(stranger.Post("/signin", {{"member", "Ada Moss"}, {"passphrase", "meadow lantern river"}}).status == 403);
  CHECK(testing::FingerprintOf(s.study.db()) == before);
  // Sign-out ends the session on the desk, not only in the browser.
  const std::string token = ada.csrf();
  CHECK(ada.Post("/signout", {{"csrf", token}}).location == "/signin");
  CHECK(ada.Get("/today").location == "/signin");
}

TEST_CASE("desk http: a wrong passphrase makes the next try wait, and strangers cannot sign in") {
  DeskStudy s;
  DeskClient ada(s.url());
  ada.SignIn("Ada Moss", "meadow lantern river");
  DeskClient guesser(s.url());
  auto page = guesser.Get("/signin");
  auto wrong = guesser.Post(
      "/signin",
      {{"signin", DeskClient::Hidden(page.body, "signin")}, {"member", "Ada Moss"}, {"passphrase", "meadow lantern"}});
  CHECK(wrong.status == 400);
  CHECK(ClassText(wrong.body, "refused") == "wrong passphrase for Ada Moss \u2014 wait 1 second before the next try");
  auto again = guesser.Post("/signin", {{"signin", DeskClient::Hidden(wrong.body, "signin")},
                                        {"member", "Ada Moss"},
                                        {"passphrase", "meadow lantern river"}});
  CHECK(ClassText(again.body, "refused") ==
        "too many wrong passphrases for Ada Moss \u2014 wait 1 second, then try again");
  auto stranger = guesser.Post(
      "/signin", {{"signin", DeskClient::Hidden(again.body, "signin")}, {"member", "Mallory"}, {"passphrase", "x"}});
  CHECK(ClassText(stranger.body, "refused") ==
        "'Mallory' is not in the study's [team] \u2014 ask whoever keeps study.toml to add you");
}

TEST_CASE("desk http: a hostile note comes back as text, and no file outside materials and reports is served") {
  DeskStudy s;
  DeskClient ada(s.url());
  ada.SignIn("Ada Moss", "meadow lantern river");
  const std::string hostile = "<script>alert(1)</script>\"><svg onload=alert(2)>";
  REQUIRE(ada.Post("/today", {{"csrf", ada.csrf()}, {"probe", "P00004"}, {"sent_at", "2027-03-01T10:00"}}).status ==
          200);
  auto r = ada.Post("/record", {{"csrf", ada.csrf()}, {"probe", "P00004"}, {"code", "rejection"}, {"note", hostile}});
  REQUIRE(r.status == 200);
  auto page = ada.Get("/probe?id=P00004");
  CHECK(page.body.find(hostile) == std::string::npos);
  CHECK(page.body.find("<script") == std::string::npos);
  CHECK(page.body.find("Note: <bdi>&lt;script&gt;alert(1)&lt;/script&gt;&quot;&gt;&lt;svg onload=alert(2)&gt;</bdi>") !=
        std::string::npos);
  CHECK(ada.Get("/files/study.db").status == 404);
  CHECK(ada.Get("/files/materials/%2e%2e/study.db").status == 404);
  CHECK(ada.Get("/files/materials/..%2fstudy.db").status == 404);
}

TEST_CASE("desk http: an oversized request body is refused before it is read") {
  DeskStudy s;
  DeskClient ada(s.url());
  ada.SignIn("Ada Moss", "meadow lantern river");
  const std::string before = testing::FingerprintOf(s.study.db());
  // Debian's cpp-httplib caps a form at 8 KiB, every other body at the desk's 64 KiB.
  for (size_t size : {9 * 1024, 70 * 1024}) {
    auto r =
        ada.Post("/record",
                 {{"csrf", ada.csrf()}, {"probe", "P00001"}, {"code", "rejection"}, {"note", std::string(size, 'x')}});
    CHECK(r.status == 413);
    CHECK(ClassText(r.body, "notice error") ==
          "The form was too large for the desk (a note can hold about 8,000 characters). Nothing was recorded; go "
          "back, shorten it and send it again.");
  }
  CHECK(testing::FingerprintOf(s.study.db()) == before);
  REQUIRE(ada.Post("/today", {{"csrf", ada.csrf()}, {"probe", "P00001"}, {"sent_at", "2027-03-01T10:00"}}).status ==
          200);
  CHECK(ada.Post("/record",
                 {{"csrf", ada.csrf()}, {"probe", "P00001"}, {"code", "rejection"}, {"note", std::string(7000, 'x')}})
            .status == 200);
}
