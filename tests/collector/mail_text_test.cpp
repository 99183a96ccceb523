#include "collector/mail_text.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("mail text: quoted lines and the quoted history after 'wrote:' are not fresh") {
  std::string body =
      "Dear Aldo,\nwe would like to meet you.\n> quoted inline\nRegards\n\n"
      "On Mon, 1 Mar 2027 at 09:12, Aldo Brenvik <aldo.brenvik@postbox.example> wrote:\n"
      "Unquoted history that follows the attribution.\n> Dear hiring team";
  CHECK(FreshText(body, "Re: Application") == "Dear Aldo,\nwe would like to meet you.\nRegards");
}

TEST_CASE("mail text: an Original Message line or an embedded header block ends a reply") {
  CHECK(FreshText("Thanks.\n-----Original Message-----\nFrom: x\nold text", "Re: x") == "Thanks.");
  CHECK(FreshText("Thanks.\n\nFrom: Aldo Brenvik <aldo.brenvik@postbox.example>\nSent: Monday\nTo: jobs\n"
                  "Subject: Application\n\nI could send references.",
                  "RE: Application") == "Thanks.");
  // A "From:" line alone (no Subject/Date after it) is text.
  CHECK(FreshText("Greetings\nFrom: the team\nbye", "") == "Greetings\nFrom: the team\nbye");
}

TEST_CASE("mail text: a forwarded message is read up to its own quoted history") {
  std::string body =
      "FYI\n\n---------- Forwarded message ---------\nFrom: Orlinde Bakehouse <jobs@orlinde-bakehouse.example>\n"
      "Date: Fri, 5 Mar 2027 at 11:02\nSubject: Interview\nTo: Kemi <kemi.saralon@postbox.example>\n\n"
      "we would like to invite you.\n\nOn Mon, 1 Mar 2027, Kemi wrote:\n> could you send the plan?";
  std::string fresh = FreshText(body, "Fwd: Interview");
  CHECK(fresh.find("we would like to invite you.") != std::string::npos);
  CHECK(fresh.find("From: Orlinde Bakehouse") != std::string::npos);
  CHECK(fresh.find("could you send") == std::string::npos);
  CHECK(fresh.find("Kemi wrote:") == std::string::npos);
}

TEST_CASE("mail text: with a Fw: subject the first header block is the forwarded message") {
  std::string body =
      "see below\n-----Original Message-----\nFrom: hr@kestrel-print.example\nSent: Friday\nSubject: Operator\n\n"
      "Please call us.\n-----Original Message-----\nFrom: applicant\nSent: Monday\nSubject: Application\n\nold";
  std::string fresh = FreshText(body, "FW: Operator");
  CHECK(fresh.find("Please call us.") != std::string::npos);
  CHECK(fresh.find("old") == std::string::npos);
}

TEST_CASE("mail text: search text collapses blanks and folds case, keeping a map to the original") {
  SearchText st = MakeSearchText("  Invite YOU\n\tto an\xc2\xa0Interview – \xc3\x96yvind’s  ");
  // The no-break space is a blank and collapses; the dash and the
  // apostrophe stay as written in `plain` and turn plain in `folded`.
  CHECK(st.plain == "Invite YOU to an Interview \xe2\x80\x93 \xc3\x96yvind\xe2\x80\x99s");
  CHECK(st.folded == "invite you to an interview - \xc3\xb6yvind's");
  REQUIRE(st.origin.size() == st.folded.size() + 1);
  CHECK(st.origin.back() == st.plain.size());
}

TEST_CASE("mail text: phrases match as whole words only") {
  std::string folded = MakeSearchText("We invite you. Uninvited guests; invite-you cards; invite you").folded;
  auto hits = FindWholeWords(folded, FoldPhrase("Invite  you"));
  REQUIRE(hits.size() == 2);
  CHECK(folded.substr(hits[0], 10) == "invite you");
  CHECK(hits[1] == folded.size() - 10);
  CHECK(FindWholeWords(folded, "").empty());
  CHECK(FindWholeWords(MakeSearchText("an interview.").folded, "interview.").size() == 1);
  // Non-ASCII letters are letters: "täglich" does not hold the word "glich".
  CHECK(FindWholeWords(MakeSearchText("t\xc3\xa4glich").folded, "glich").empty());
  CHECK(FindWholeWords(MakeSearchText("\xc3\x96YVIND").folded, FoldPhrase("\xc3\xb6yvind")).size() == 1);
}

TEST_CASE("mail text: a negation among the four words before a phrase, in the same sentence") {
  const std::vector<std::string> negations = {"not", "cannot", "no longer"};
  auto negated = [&](const std::string& text) {
    std::string folded = MakeSearchText(text).folded;
    auto hits = FindWholeWords(folded, "invite you");
    REQUIRE(hits.size() == 1);
    return IsNegated(folded, hits[0], negations);
  };
  CHECK(negated("we cannot invite you"));
  CHECK(negated("We are not able to invite you"));
  CHECK(negated("we can no longer invite you"));
  CHECK_FALSE(negated("We will not forget this. We invite you"));
  CHECK_FALSE(negated("not one, two, three, four words invite you"));
  CHECK_FALSE(negated("knot invite you"));
}

TEST_CASE("mail text: contexts and clips cut at code points and mark the cut") {
  std::string plain = "\xc3\x96yvind says: please call us today";
  size_t at = plain.find("please");
  CHECK(ContextAround(plain, at, at + 6, 6) ==
        "\xe2\x80\xa6"
        "says: please call \xe2\x80\xa6");
  CHECK(ContextAround(plain, 0, 2, 3) == "\xc3\x96yvi\xe2\x80\xa6");
  CHECK(Clip(plain, 6) == "\xc3\x96yvind\xe2\x80\xa6");
  CHECK(Clip("short", 10) == "short");
}
