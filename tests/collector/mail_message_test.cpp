// Parsing whole messages: the fixtures of make_fixtures.py (encoded there
// with Python's base64, quopri and email.header) and small cases written here.
#include "collector/mail_message.h"

#include <catch2/catch.hpp>

#include "collector/mail_source.h"
#include "testing/testing.h"

using namespace twinprobe;

namespace {

std::vector<RawMail> FixtureMbox() {
  auto r = ReadMbox(testing::SourceDir() + "/tests/fixtures/mail/study/mail/inbox.mbox");
  REQUIRE(r.ok());
  return r.value();
}

bool Contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

}  // namespace

TEST_CASE("mail message: plain US-ASCII with a folded subject") {
  MailMessage m = ParseMailMessage(FixtureMbox()[0].raw);
  CHECK(m.message_id == "20270304.invite.0101@orlinde-bakehouse.example");
  CHECK(m.subject == "Your application: baker's assistant (V0101)");
  CHECK(m.from == "Hanne Ostrel <hanne.ostrel@orlinde-bakehouse.example>");
  CHECK(m.date == 1804151700);
  CHECK(m.sender_addresses == std::vector<std::string>{"hanne.ostrel@orlinde-bakehouse.example"});
  CHECK(m.recipient_addresses == std::vector<std::string>{"aldo.brenvik@postbox.example"});
  CHECK(Contains(m.text, "We would like to invite you to an\ninterview on Tuesday"));
  CHECK(m.attachments == 0);
}

TEST_CASE("mail message: ISO-8859-1 quoted-printable body and Q-encoded headers") {
  MailMessage m = ParseMailMessage(FixtureMbox()[1].raw);
  CHECK(m.subject == "Re: Application \u2013 warehouse clerk");
  CHECK(m.from == "Ren\u00e9e Halvard <renee.halvard@brakkeport-freight.example>");
  CHECK(m.date == 1804176120);
  CHECK(Contains(m.text, "Unfortunately we have decided to continue with other candidates whose experience"));
  CHECK(Contains(m.text, "Ren\u00e9e Halvard, Direkt\u00f8r of people matters"));
}

TEST_CASE("mail message: multipart/alternative prefers text/plain, B-encoded UTF-8 words") {
  MailMessage m = ParseMailMessage(FixtureMbox()[2].raw);
  CHECK(m.subject == "Print operator \u2013 a question about your certificate \u2713");
  CHECK(m.from == "\u00d6yvind Marsk <oyvind.marsk@kestrel-print.example>");
  CHECK(m.text ==
        "Hello Aldo,\n\nthanks for applying. Could you send us a copy of your vocational certificate before "
        "Friday?\n\nKind regards \u2014 \u00d6yvind Marsk\nKestrel Print Works");
  CHECK(m.attachments == 1);  // the HTML alternative
}

TEST_CASE("mail message: an HTML-only message is read as text, quoted part marked") {
  MailMessage m = ParseMailMessage(FixtureMbox()[3].raw);
  CHECK(Contains(m.text, "Thank you for applying to Marrowgate Dental & Hygiene.\nPlease call us on 0555 0199"));
  CHECK(Contains(m.text, "> I would welcome an interview invitation."));
  CHECK_FALSE(Contains(m.text, "color"));  // the style sheet
  CHECK_FALSE(Contains(m.text, "<p>"));
}

TEST_CASE("mail message: nested multipart/mixed leaves the PDF out") {
  MailMessage m = ParseMailMessage(FixtureMbox()[4].raw);
  CHECK(Contains(m.text, "we are pleased to invite you to an interview at Tessvale Care Homes"));
  CHECK_FALSE(Contains(m.text, "PDF"));
  CHECK_FALSE(Contains(m.text, "<p>"));
  CHECK(m.attachments == 2);  // the HTML alternative and the PDF
  CHECK(m.date == 1804235400);
}

TEST_CASE("mail message: an inline forward names its original sender") {
  MailMessage m = ParseMailMessage(FixtureMbox()[5].raw);
  CHECK(m.recipient_addresses == std::vector<std::string>{"fieldwork@study.example"});
  CHECK(m.sender_addresses == std::vector<std::string>{"kemi.saralon@postbox.example"});
  CHECK(m.forwarded_sender_addresses == std::vector<std::string>{"jobs@orlinde-bakehouse.example"});
  CHECK(m.is_forward);
  CHECK(m.forwarded_date == 1804244520);  // "Fri, 5 Mar 2027 at 11:02", no zone: 2027-03-05T11:02Z
}

TEST_CASE("mail message: an attached message (message/rfc822) is read with its headers") {
  MailMessage m = ParseMailMessage(FixtureMbox()[6].raw);
  CHECK(Contains(m.text,
                 "See attached.\n\n-------- Attached message --------\nFrom: Marrowgate Dental "
                 "<office@marrowgate-dental.example>\nDate: Tue, 09 Mar 2027 08:00:00 +0100\n"
                 "Subject: Your application (V0105)\nTo: aldo.brenvik@postbox.example"));
  CHECK(Contains(m.text, "we regret to tell you that the position has been filled."));
  CHECK(m.forwarded_sender_addresses == std::vector<std::string>{"office@marrowgate-dental.example"});
  CHECK(m.is_forward);
  CHECK(m.forwarded_date == 1804575600);  // Tue, 09 Mar 2027 08:00:00 +0100
}

TEST_CASE("mail message: a reply quoting a header block is not a forward") {
  MailMessage m = ParseMailMessage(
      "Subject: RE: Application\nDate: Wed, 10 Mar 2027 07:45:00 +0100\n\nThanks, see you.\n\n"
      "From: Aldo Brenvik <aldo.brenvik@postbox.example>\nSent: Mon, 1 Mar 2027 09:00:00 +0000\nSubject: "
      "Application\n");
  CHECK_FALSE(m.is_forward);
  CHECK_FALSE(m.forwarded_date.has_value());
  CHECK(m.forwarded_sender_addresses == std::vector<std::string>{"aldo.brenvik@postbox.example"});
}

TEST_CASE("mail message: no Message-ID, no MIME headers: plain text by default") {
  MailMessage m = ParseMailMessage(FixtureMbox()[7].raw);
  CHECK(m.message_id.empty());
  CHECK(m.text == "Dear Aldo Brenvik, please send us your forklift licence number.");
}

TEST_CASE("mail message: damaged structure is read as far as it goes") {
  // A multipart without a boundary parameter, and one never closed.
  MailMessage a = ParseMailMessage("Content-Type: multipart/mixed\n\nraw body text\n");
  CHECK(a.text == "raw body text");
  MailMessage b = ParseMailMessage(
      "Content-Type: multipart/mixed; boundary=x\n\n--x\nContent-Type: text/plain\n\nfirst\n--x\n\nsecond, unclosed\n");
  CHECK(b.text == "first\n\nsecond, unclosed");
  MailMessage c = ParseMailMessage("");
  CHECK(c.text.empty());
  CHECK(c.subject.empty());
  CHECK_FALSE(c.date.has_value());
  // An attachment disposition on a text part keeps it out of the text.
  MailMessage d = ParseMailMessage(
      "Content-Type: multipart/mixed; boundary=y\n\n--y\n\nbody\n--y\nContent-Type: text/plain\n"
      "Content-Disposition: attachment; filename=cv.txt\n\nattached cv\n--y--\n");
  CHECK(d.text == "body");
  CHECK(d.attachments == 1);
}

TEST_CASE("mail message: deep nesting stops without failing") {
  std::string raw;
  for (int i = 0; i < 40; ++i)
    raw += "Content-Type: multipart/mixed; boundary=b" + std::to_string(i) + "\n\n--b" + std::to_string(i) + "\n";
  raw += "Content-Type: text/plain\n\ntoo deep\n";
  MailMessage m = ParseMailMessage(raw);
  CHECK(m.text.empty());
}
