// Damaged mail end to end (issue 12): `twinprobe mail` reads a mailbox of
// damaged messages as far as they go and stores each one for review, because
// a response must never be lost to a stray byte (docs/mail.md). What is
// refused instead (a file that is no mailbox at all) is in the bad-input
// battery.
#include <catch2/catch.hpp>

#include <filesystem>

#include <nlohmann/json.hpp>

#include "collector/mail_codec.h"
#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;
namespace fs = std::filesystem;

namespace {

std::string Message(const std::string& id, const std::string& headers, const std::string& body) {
  return "From: Hanne Ostrel <hanne.ostrel@orlinde-bakehouse.example>\n"
         "To: aldo.brenvik@postbox.example\n"
         "Message-ID: <" + id + "@orlinde-bakehouse.example>\n" + headers + "\n" + body;
}

const std::string kFrom = "From hanne.ostrel@orlinde-bakehouse.example Thu Mar  4 09:15:00 2027\n";

}  // namespace

TEST_CASE("damaged mail: NUL bytes, a huge header, Latin-1 without charset, a 60-digit year and a cut are read") {
  testing::TempDir dir;
  std::string study = dir / "study";
  fs::copy(testing::SourceDir() + "/tests/robustness/fixture_study", study, fs::copy_options::recursive);
  REQUIRE(testing::RunCli({"--study", study, "plan"}).exit_code == 0);

  std::string mbox;
  mbox += kFrom + Message("nul", "Subject: Your application\n", std::string("We would like to invite\0 you.\n", 30)) + "\n";
  mbox += kFrom + Message("huge", "X-Trace: " + std::string(2 << 20, 'a') + "\nSubject: Huge\n", "Thank you.\n") + "\n";
  // Latin-1 bytes with no charset: read as windows-1252 (mail_codec.h).
  mbox += kFrom + Message("latin1", "Subject: Einladung\n", "Zum Vorstellungsgespr\xe4" "ch am Montag.\n") + "\n";
  // Found by tests/fuzz/mail_fuzzer: this line made `mail` stop with
  // "internal error: stoi" (exit 3). Its date cannot be read, so it is no
  // separator and stays text of the message above (mboxo rules).
  mbox += "From renee.halvard@brakkeport-freight.example Thu Mar  4 16:02:00 " + std::string(60, '9') + "\n";
  mbox += "Subject: not a message of its own\n\n";
  mbox += kFrom + "From: Renee Halvard <renee.halvard@brakkeport-freight.example>\nSubject: cut he";  // cut mid-header
  testing::WriteFile(study + "/damaged.mbox", mbox);

  auto r = testing::RunCli({"--study", study, "--json", "mail", "--mbox", study + "/damaged.mbox"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  INFO(j.dump(1));
  CHECK(j["read"] == 4);
  CHECK(j["stored"] == 4);

  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  CHECK(store.value()->QueryInt("SELECT count(*) FROM mail_message") == 4);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM response") == 0);  // nothing is recorded without review
  // The review excerpt (JSON) of each message, in mailbox order.
  Stmt q = store.value()->Prepare("SELECT excerpt FROM mail_message ORDER BY id");
  std::vector<nlohmann::json> excerpts;
  while (q.Step()) {
    REQUIRE(IsUtf8(q.Text(0)));
    excerpts.push_back(nlohmann::json::parse(q.Text(0)));
  }
  REQUIRE(excerpts.size() == 4);
  CHECK(excerpts[0]["message_id"] == "nul@orlinde-bakehouse.example");
  CHECK(excerpts[0]["text"].get<std::string>().rfind("We would like to invite", 0) == 0);
  CHECK(excerpts[1]["message_id"] == "huge@orlinde-bakehouse.example");
  CHECK(excerpts[1]["text"] == "Thank you.");
  CHECK(excerpts[2]["message_id"] == "latin1@orlinde-bakehouse.example");
  CHECK(excerpts[2]["text"].get<std::string>().find("Vorstellungsgespr\xc3\xa4" "ch am Montag.") != std::string::npos);
  CHECK(excerpts[2]["text"].get<std::string>().find("not a message of its own") != std::string::npos);
  CHECK(excerpts[3]["subject"] == "cut he");
  CHECK(testing::RunCli({"--study", study, "verify"}).exit_code == 0);
}
