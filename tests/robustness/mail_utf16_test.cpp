// Issue 23: a body labelled charset=utf-16 was shown raw, a NUL between every
// letter, so the review showed no words and the suggestion rules matched
// nothing. Windows mail clients write UTF-16 little-endian, often without a
// byte order mark; RFC 2781 names big-endian the default. Each of the six
// forms is read through the whole message parser here.
#include <catch2/catch.hpp>

#include <string>

#include "collector/mail_message.h"

using namespace twinprobe;

namespace {

std::string Bytes(const std::string& hex) {
  std::string out;
  for (size_t i = 0; i + 1 < hex.size(); i += 2) out += static_cast<char>(std::stoi(hex.substr(i, 2), nullptr, 16));
  return out;
}

// "Einladung zum Gespräch" as Python's str.encode("utf-16-le") and
// str.encode("utf-16-be") give it.
const std::string kLe =
    "450069006e006c006100640075006e00670020007a0075006d00200047006500730070007200e40063006800";
const std::string kBe =
    "00450069006e006c006100640075006e00670020007a0075006d00200047006500730070007200e400630068";

std::string Message(const std::string& charset, const std::string& body) {
  return "From: Hanne Ostrel <hanne.ostrel@orlinde-bakehouse.example>\n"
         "To: aldo.brenvik@postbox.example\n"
         "Subject: Ihre Bewerbung\n"
         "MIME-Version: 1.0\n"
         "Content-Type: text/plain; charset=" + charset + "\n"
         "Content-Transfer-Encoding: 8bit\n\n" + body;
}

}  // namespace

TEST_CASE("issue 23: a utf-16 body is decoded, little- or big-endian, with or without a byte order mark") {
  const std::string expected = "Einladung zum Gespr\u00e4ch";
  struct Form {
    const char* charset;
    std::string hex;
  };
  const Form forms[] = {
      {"utf-16le", kLe},          {"utf-16be", kBe},          // labelled, no mark
      {"UTF-16LE", "fffe" + kLe}, {"utf-16be", "feff" + kBe},  // labelled, with the mark
      {"utf-16", "fffe" + kLe},   {"utf-16", "feff" + kBe},    // the mark decides
      {"\"utf-16\"", kLe},        {"utf-16", kBe},             // no mark: where the zeros stand
  };
  for (const Form& f : forms) {
    INFO(f.charset << " " << f.hex.substr(0, 4));
    MailMessage m = ParseMailMessage(Message(f.charset, Bytes(f.hex)));
    CHECK(m.text == expected);
  }
}

TEST_CASE("issue 23: a damaged utf-16 body keeps its letters, a lone surrogate and an odd byte become U+FFFD") {
  // U+1F600 as the surrogate pair 3d d8 00 de, then a lone high surrogate
  // (3d d8) before "A", then an odd last byte.
  MailMessage m = ParseMailMessage(Message("utf-16le", Bytes("3dd800de" "3dd8" "4100" "42")));
  CHECK(m.text == "\U0001F600\uFFFDA\uFFFD");
}
