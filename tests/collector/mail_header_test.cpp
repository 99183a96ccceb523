// Headers: unfolding, encoded words, MIME parameters, addresses, dates.
// Decoded values and epoch seconds were computed with Python's email
// package (email.header.decode_header, email.utils.parsedate_to_datetime).
#include "collector/mail_header.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("mail header: folded lines unfold and names match in any case") {
  std::string_view header, body;
  SplitHeaderBody(
      "Subject: Your application:\r\n baker's assistant\r\n\t(V0101)\r\nX-Empty:\r\nnot a field\r\n\r\nBody\r\n",
      header, body);
  CHECK(body == "Body\r\n");
  HeaderBlock h = ParseHeaderBlock(header);
  REQUIRE(h.fields.size() == 2);
  CHECK(h.Get("subject") == "Your application: baker's assistant\t(V0101)");
  CHECK(h.Has("X-EMPTY"));
  CHECK(h.Get("X-Empty") == "");
  CHECK(h.Get("Missing") == "");
}

TEST_CASE("mail header: a message without an empty line is all header") {
  std::string_view header, body;
  SplitHeaderBody("From: a@b.example\n", header, body);
  CHECK(header == "From: a@b.example\n");
  CHECK(body.empty());
  SplitHeaderBody("\nbody only", header, body);
  CHECK(header.empty());
  CHECK(body == "body only");
}

TEST_CASE("mail header: encoded words B and Q, adjacent words joined") {
  // str(make_header(decode_header(...))) == "Öyvind Marsk and Renée"
  CHECK(DecodeHeaderText("=?UTF-8?B?w5Z5dmluZA==?= =?UTF-8?Q?_Marsk?= and =?iso-8859-1?q?Ren=E9e?=") ==
        "\xc3\x96yvind Marsk and Ren\xc3\xa9"
        "e");
  // A UTF-8 character split across two words ("€" = E2 82 AC).
  CHECK(DecodeHeaderText("=?UTF-8?B?4oI=?=\r\n =?UTF-8?B?rHVybw==?=") == "\xe2\x82\xacuro");
  CHECK(DecodeHeaderText("=?iso-8859-1?q?Re:_Application_=96_warehouse_clerk?=") ==
        "Re: Application \xe2\x80\x93 warehouse clerk");
  CHECK(DecodeHeaderText("=?utf-8*en?q?hello?=") == "hello");
}

TEST_CASE("mail header: malformed encoded words stay as written") {
  CHECK(DecodeHeaderText("=?utf-8?X?abc?=") == "=?utf-8?X?abc?=");
  CHECK(DecodeHeaderText("price =? unknown") == "price =? unknown");
  CHECK(DecodeHeaderText("=?utf-8?q?never closed") == "=?utf-8?q?never closed");
  CHECK(DecodeHeaderText("raw caf\xe9") == "raw caf\xc3\xa9");  // 8-bit Latin-1 without encoding
}

TEST_CASE("mail header: MIME values with quoted and RFC 2231 parameters") {
  MimeValue ct = ParseMimeValue("Multipart/Alternative; boundary=\"alt;3f9\"; charset=UTF-8");
  CHECK(ct.type == "multipart/alternative");
  CHECK(ct.Param("boundary") == "alt;3f9");
  CHECK(ct.Param("charset") == "UTF-8");
  CHECK(ct.Param("missing") == "");
  MimeValue cd = ParseMimeValue("attachment; filename*0*=iso-8859-1''Lebenslauf%20Ren%E9; filename*1=\"e.pdf\"");
  CHECK(cd.type == "attachment");
  CHECK(cd.Param("filename") ==
        "Lebenslauf Ren\xc3\xa9"
        "e.pdf");
  CHECK(ParseMimeValue("").type == "");
}

TEST_CASE("mail header: addresses are found in display forms, lowercased, once") {
  auto a = ExtractAddresses(
      "\"Ostrel, Hanne\" <Hanne.Ostrel@Orlinde-Bakehouse.example>, aldo.brenvik@postbox.example, "
      "<aldo.brenvik@POSTBOX.example>; not-an-address@localhost");
  REQUIRE(a.size() == 2);
  CHECK(a[0] == "hanne.ostrel@orlinde-bakehouse.example");
  CHECK(a[1] == "aldo.brenvik@postbox.example");
  CHECK(ExtractAddresses("write to jobs@orlinde-bakehouse.example.").front() == "jobs@orlinde-bakehouse.example");
  CHECK(AddressDomain("Jobs@Orlinde-Bakehouse.Example") == "orlinde-bakehouse.example");
  CHECK(AddressDomain("nobody") == "");
}

TEST_CASE("mail header: RFC 5322 dates, with obsolete forms, as UTC") {
  // email.utils.parsedate_to_datetime(...).timestamp()
  CHECK(ParseMailDate("Thu, 04 Mar 2027 10:15:00 +0100") == 1804151700);
  CHECK(ParseMailDate("4 Mar 2027 16:02 +0000") == 1804176120);
  CHECK(ParseMailDate("Fri, 5 Mar 2027 08:30:00 GMT") == 1804235400);
  CHECK(ParseMailDate("Sun, 7 Mar 99 23:59:59 EST") == 920869199);
  CHECK(ParseMailDate("Mon, 1 Mar 2027 00:30:00 -0130 (invented zone)") == 1803866400);
  CHECK(ParseMailDate("Fri, 5 Mar 2027 at 11:02") == 1804244520);  // forwarded-header form, read as UTC
  CHECK_FALSE(ParseMailDate("").has_value());
  CHECK_FALSE(ParseMailDate("next Tuesday").has_value());
  CHECK_FALSE(ParseMailDate("31 Feb 2027 10:00:00 +0000").has_value());
  CHECK_FALSE(ParseMailDate("4 Mar 2027 25:00:00 +0000").has_value());
}

TEST_CASE("mail header: the asctime date of an mbox From line") {
  // Thu Mar  4 09:15:00 2027 UTC == 1804151700 (the same instant as above).
  CHECK(ParseMboxFromLineDate("From hanne.ostrel@orlinde-bakehouse.example Thu Mar  4 09:15:00 2027") == 1804151700);
  CHECK(ParseMboxFromLineDate("From - Thu Mar 04 09:15:00 2027") == 1804151700);
  CHECK_FALSE(ParseMboxFromLineDate("From the whole team at the bakehouse").has_value());
}

// Found by tests/fuzz/mail_fuzzer: std::stoi threw on a digit run too long
// for an int, which stopped `twinprobe mail` with an internal error.
TEST_CASE("mail header: an mbox From line with a year too long for a number is no date, not a crash") {
  const std::string year(60, '9');
  CHECK_FALSE(ParseMboxFromLineDate("From renee.halvard@brakkeport-freight.example Thu Mar  4 16:02:00 " + year));
  CHECK_FALSE(ParseMboxFromLineDate("From - Thu Mar 444444444444444444444 16:02:00 2027"));
  CHECK(ParseMboxFromLineDate("From - Thu Mar  4 09:15:00 2027") == 1804151700);  // the reading is unchanged
}

TEST_CASE("mail header: over-long numbers in a Date and an RFC 2231 index are damage, not a crash") {
  CHECK_FALSE(ParseMailDate("Thu, 04 Mar " + std::string(40, '2') + " 10:15:00 +0100"));
  CHECK_FALSE(ParseMailDate("Thu, " + std::string(40, '4') + " Mar 2027 10:15:00 +0100"));
  CHECK(ParseMailDate("Thu, 04 Mar 2027 10:15:00 +0100") == 1804151700);
  // The piece with an impossible index is dropped; the rest still joins.
  MimeValue cd = ParseMimeValue("attachment; filename*0=\"cv\"; filename*99999999999=\"x\"; filename*1=\".pdf\"");
  CHECK(cd.Param("filename") == "cv.pdf");
}
