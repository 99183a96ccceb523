// Reading mbox files and Maildir folders, on the fixtures made by
// tests/fixtures/mail/make_fixtures.py and on small files written here.
#include "collector/mail_source.h"

#include <catch2/catch.hpp>

#include "testing/testing.h"

using namespace twinprobe;

namespace {
std::string Fixture(const std::string& rel) { return testing::SourceDir() + "/tests/fixtures/mail/" + rel; }
}  // namespace

TEST_CASE("mail source: the fixture mbox splits into its eleven messages with their places and dates") {
  auto r = ReadMbox(Fixture("study/mail/inbox.mbox"));
  REQUIRE(r.ok());
  const auto& msgs = r.value();
  REQUIRE(msgs.size() == 11);
  CHECK(msgs[0].where == Fixture("study/mail/inbox.mbox") + ":1");
  CHECK(msgs[0].raw.rfind("Return-Path: <hanne.ostrel@orlinde-bakehouse.example>\n", 0) == 0);
  CHECK(msgs[0].envelope_time == 1804151700);  // Thu Mar  4 09:15:00 2027 UTC
  for (const auto& m : msgs) CHECK(m.raw.rfind("From ", 0) != 0);
  // The separator's empty line is not part of the message before it.
  CHECK(msgs[0].raw.substr(msgs[0].raw.size() - 2) != "\n\n");
  CHECK(msgs[0].raw == msgs[10].raw);  // the message stored twice
}

TEST_CASE("mail source: mboxrd unescaping removes one '>' from >From lines") {
  auto r = ReadMbox(Fixture("study/mail/inbox.mbox"));
  REQUIRE(r.ok());
  const std::string& m = r.value()[0].raw;
  CHECK(m.find("\nFrom the whole team at the bakehouse") != std::string::npos);
  CHECK(m.find("\n>From the archive") != std::string::npos);
  CHECK(m.find(">>From") == std::string::npos);
}

TEST_CASE("mail source: a From line inside a body without a date does not split the message") {
  testing::TempDir dir;
  testing::WriteFile(dir / "a.mbox",
                     "From a@x.example Thu Mar  4 09:15:00 2027\nSubject: one\n\nhello\n\nFrom here on, unescaped.\n\n"
                     "From b@x.example Fri Mar  5 09:15:00 2027\nSubject: two\n\nbye\n");
  auto r = ReadMbox(dir / "a.mbox");
  REQUIRE(r.ok());
  REQUIRE(r.value().size() == 2);
  CHECK(r.value()[0].raw == "Subject: one\n\nhello\n\nFrom here on, unescaped.\n");
  CHECK(r.value()[1].where == dir / "a.mbox:8");
  CHECK(r.value()[1].raw == "Subject: two\n\nbye\n");
}

TEST_CASE("mail source: an empty mbox holds no messages, a wrong file is refused with its place") {
  testing::TempDir dir;
  testing::WriteFile(dir / "empty.mbox", "");
  auto empty = ReadMbox(dir / "empty.mbox");
  REQUIRE(empty.ok());
  CHECK(empty.value().empty());

  testing::WriteFile(dir / "notes.txt", "call the bakehouse back\n\nnot an mbox\n");
  auto wrong = ReadMbox(dir / "notes.txt");
  REQUIRE_FALSE(wrong.ok());
  CHECK(wrong.error().Message() == dir / "notes.txt" +
                                       ":1:1: this is not an mbox file: it does not start with a "
                                       "'From ' line \u2014 pass a Maildir folder with --maildir, or "
                                       "export the mailbox in mbox format");
  auto missing = ReadMbox(dir / "nothing.mbox");
  REQUIRE_FALSE(missing.ok());
  CHECK(missing.error().Message() == dir / "nothing.mbox" + ": cannot read the mbox file \u2014 check the path");
  auto folder = ReadMbox(dir.path());
  REQUIRE_FALSE(folder.ok());
  CHECK(folder.error().what == "this is a folder, not an mbox file");
}

TEST_CASE("mail source: a Maildir is read new/ then cur/, in name order, with delivery times") {
  auto r = ReadMaildir(Fixture("study/mail/Maildir"));
  REQUIRE(r.ok());
  const auto& msgs = r.value();
  REQUIRE(msgs.size() == 5);
  CHECK(msgs[0].where == Fixture("study/mail/Maildir/new/1804662300.M1P1.fixture"));
  CHECK(msgs[0].envelope_time == 1804662300);
  CHECK(msgs[3].where == Fixture("study/mail/Maildir/cur/1804140900.M4P1.fixture:2,S"));
  CHECK(msgs[0].raw.find("\r\n") != std::string::npos);  // that file has CRLF line ends
}

TEST_CASE("mail source: a folder without cur/ and new/ is not a Maildir") {
  testing::TempDir dir;
  testing::WriteFile(dir / "box/new/1.x", "Subject: a\n\nb\n");
  auto r = ReadMaildir(dir / "box");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() == dir / "box" +
                                   ": this is not a Maildir folder: it has no cur/ and new/ folders \u2014 "
                                   "pass the folder that holds cur/ and new/, or an mbox file with --mbox");
  auto missing = ReadMaildir(dir / "nothing");
  REQUIRE_FALSE(missing.ok());
  CHECK(missing.error().what == "no such folder");
  auto file = ReadMaildir(dir / "box/new/1.x");  // an mbox or message file passed as a Maildir
  REQUIRE_FALSE(file.ok());
  CHECK(file.error().Message() == dir / "box/new/1.x" + ": this is a file, not a Maildir folder \u2014 pass an mbox file with --mbox");
}

TEST_CASE("mail source: the canonical form makes CRLF and LF copies of a message equal") {
  CHECK(CanonicalRaw("Subject: a\r\n\r\nbody\r\n\r\n") == "Subject: a\n\nbody\n");
  CHECK(CanonicalRaw("Subject: a\n\nbody") == "Subject: a\n\nbody\n");
  auto mbox = ReadMbox(Fixture("study/mail/inbox.mbox"));
  auto maildir = ReadMaildir(Fixture("study/mail/Maildir"));
  REQUIRE(mbox.ok());
  REQUIRE(maildir.ok());
  CHECK(CanonicalRaw(mbox.value()[7].raw) == CanonicalRaw(maildir.value()[0].raw));
  CHECK(mbox.value()[7].raw != maildir.value()[0].raw);
}

// Found by tests/fuzz/mail_fuzzer: a "From " line whose year is a 60-digit
// number made ReadMbox throw (std::out_of_range from std::stoi) instead of
// reading the line as text of the message before it.
TEST_CASE("mail source: a From line with a year too long for a number is message text, not a crash") {
  testing::TempDir dir;
  testing::WriteFile(dir / "a.mbox",
                     "From hanne.ostrel@orlinde-bakehouse.example Thu Mar  4 09:15:00 2027\n"
                     "Subject: first\n\nbody one\n\n"
                     "From renee.halvard@brakkeport-freight.example Thu Mar  4 16:02:00 " + std::string(60, '9') + "\n"
                     "Subject: second\n\nbody two\n");
  auto r = ReadMbox(dir / "a.mbox");
  REQUIRE(r.ok());
  REQUIRE(r.value().size() == 1);
  CHECK(r.value()[0].raw.find("\nFrom renee.halvard@brakkeport-freight.example Thu Mar  4 16:02:00 999") !=
        std::string::npos);
}

TEST_CASE("mail source: a message file, a gzip or UTF-16 export is refused as what it is, a byte order mark is skipped") {
  testing::TempDir dir;
  const std::string message = "Return-Path: <hanne.ostrel@orlinde-bakehouse.example>\nSubject: hello\n\nbody\n";
  const std::string mbox = "From hanne.ostrel@orlinde-bakehouse.example Thu Mar  4 09:15:00 2027\n" + message;
  auto refusal = [&](const std::string& name, const std::string& bytes) {
    testing::WriteFile(dir / name, bytes);
    auto r = ReadMbox(dir / name);
    REQUIRE_FALSE(r.ok());
    CHECK(r.error().where == dir / name + ":1:1");
    return r.error().what + " \u2014 " + r.error().fix;
  };
  CHECK(refusal("one.eml", message) ==
        "this is a single message, not an mbox file: it starts with a 'Return-Path:' header, not a 'From ' line "
        "\u2014 put message files in the new/ folder of a Maildir and pass that with --maildir, or export the "
        "mailbox in mbox format");
  CHECK(refusal("inbox.mbox.gz", std::string("\x1F\x8B\x08\x00", 4) + "rest") ==
        "this is a gzip-compressed file, not an mbox file \u2014 unpack it first (gunzip) and pass the result");
  CHECK(refusal("utf16.mbox", std::string("\xFF\xFE" "F\0r\0o\0m\0", 10)) ==
        "this file is UTF-16 text, not an mbox file \u2014 export the mailbox in mbox format (mail clients write "
        "it as 8-bit text)");

  testing::WriteFile(dir / "bom.mbox", "\xEF\xBB\xBF" + mbox);
  auto bom = ReadMbox(dir / "bom.mbox");
  REQUIRE(bom.ok());
  REQUIRE(bom.value().size() == 1);
  CHECK(bom.value()[0].raw == message);
  CHECK(bom.value()[0].envelope_time == 1804151700);
}
