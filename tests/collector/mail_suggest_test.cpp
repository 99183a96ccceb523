#include "collector/mail_suggest.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

namespace {

MailRules Rules() {
  MailRules r;
  r.suggest = {{"invitation", {"invite you to an interview", "interview invitation"}, {}},
               {"info_request", {"could you send", "please call us"}, {}},
               {"rejection", {"unfortunately", "position has been filled"}, {}}};
  r.negations = {"not", "cannot"};
  return r;
}

}  // namespace

TEST_CASE("mail suggest: the first rule in the design's order with a hit wins") {
  Suggestion s = SuggestCode("Your application",
                             "Unfortunately Friday is full, so we invite you to an interview on Monday.", Rules());
  CHECK(s.code == "invitation");
  REQUIRE(s.evidence.size() == 2);
  CHECK(s.evidence[0].code == "invitation");
  CHECK(s.evidence[0].phrase == "invite you to an interview");
  CHECK(s.evidence[0].where == "body");
  CHECK_FALSE(s.evidence[0].negated);
  CHECK(s.evidence[0].context == "Unfortunately Friday is full, so we invite you to an interview on Monday.");
  CHECK(s.evidence[1].code == "rejection");
}

TEST_CASE("mail suggest: a negated phrase is set aside but shown") {
  Suggestion s =
      SuggestCode("Print operator", "We cannot invite you to an interview; the position has been filled.", Rules());
  CHECK(s.code == "rejection");
  REQUIRE(s.evidence.size() == 2);
  CHECK(s.evidence[0].negated);
  CHECK(s.evidence[0].code == "invitation");
  CHECK_FALSE(s.evidence[1].negated);
}

TEST_CASE("mail suggest: phrases match across line breaks, in any case, in the subject") {
  Suggestion s = SuggestCode("INTERVIEW   Invitation", "Could you\nsend your\ncertificate?", Rules());
  CHECK(s.code == "invitation");
  REQUIRE(s.evidence.size() == 2);
  CHECK(s.evidence[0].where == "subject");
  CHECK(s.evidence[0].context == "INTERVIEW Invitation");
  CHECK(s.evidence[1].code == "info_request");
}

TEST_CASE("mail suggest: no phrase, no suggestion") {
  Suggestion s = SuggestCode("Hello", "Thank you for your application.", Rules());
  CHECK(s.code.empty());
  CHECK(s.evidence.empty());
}

TEST_CASE("mail suggest: contexts are cut around the phrase") {
  std::string body = std::string(200, 'x') + " please call us " + std::string(200, 'y');
  Suggestion s = SuggestCode("", body, Rules(), 10);
  REQUIRE(s.evidence.size() == 1);
  CHECK(s.evidence[0].context == "\u2026xxxxxxxxx please call us yyyyyyyyy\u2026");
}
