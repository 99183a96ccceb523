// `mail` at the store level: the fixture study planned for real, the fixture
// mbox and Maildir read, every message logged once, nothing else written.
#include "collector/mail_intake.h"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include "collector/mail_source.h"
#include "core/audit.h"
#include "core/sha256.h"
#include "mail_fixture.h"
#include "planner/design_file.h"

using namespace twinprobe;
using mailtest::PlannedMailStudy;

namespace {

const std::string kAldo = "aldo.brenvik@postbox.example", kKemi = "kemi.saralon@postbox.example";

std::vector<MailBatch> FixtureBatches(const std::string& study) {
  auto mbox = ReadMbox(study + "/mail/inbox.mbox");
  auto maildir = ReadMaildir(study + "/mail/Maildir");
  REQUIRE(mbox.ok());
  REQUIRE(maildir.ok());
  return {{"mbox", study + "/mail/inbox.mbox", mbox.value()}, {"maildir", study + "/mail/Maildir", maildir.value()}};
}

MailRules FixtureRules(const std::string& study) {
  auto d = LoadDesign(study);
  REQUIRE(d.ok());
  return d.value().mail;
}

}  // namespace

TEST_CASE("mail intake: every fixture message lands once, matched as the scenario says") {
  PlannedMailStudy s;
  auto store = s.Open();
  auto r = IngestMail(*store, FixtureRules(s.study), FixtureBatches(s.study));
  REQUIRE(r.ok());
  const IntakeSummary& sum = r.value();
  CHECK(sum.read == 16);
  CHECK(sum.stored == 12);
  CHECK(sum.duplicates == 4);  // m01 twice more, m09 (no Message-ID, CRLF copy), m11 again
  CHECK(sum.matched == 9);
  CHECK(sum.queued == 3);
  CHECK_FALSE(sum.audit_hash.empty());

  struct Expected {
    std::string status, vacancy, profile, code;
  };
  // In reading order: the mbox (11 entries, one repeated), then the Maildir.
  const std::vector<Expected> expected = {
      {"matched", "V0101", kAldo, "invitation"},    // m01 plain ASCII, phrase across a line break
      {"matched", "V0102", kKemi, "rejection"},     // m02 ISO-8859-1 QP
      {"matched", "V0104", kAldo, "info_request"},  // m03 multipart/alternative, base64 UTF-8
      {"matched", "V0105", kKemi, "info_request"},  // m04 HTML only; the quoted invitation is not read
      {"matched", "V0103", kAldo, "invitation"},    // m05 nested multipart, shared mail host, exact contact
      {"matched", "V0101", kKemi, "invitation"},    // m06 inline forward from the profile's mailbox
      {"matched", "V0105", kAldo, "rejection"},     // m07 forwarded as message/rfc822
      {"matched", "V0102", kAldo, "info_request"},  // m09 no Message-ID
      {"unmatched", "", "", "invitation"},          // m10 for no profile of the study
      {"ambiguous", "", kKemi, "info_request"},     // m11 names two vacancies
      {"duplicate", "", "", ""},                    // m01 again in the mbox
      {"duplicate", "", "", ""},                    // m09 in new/ with CRLF line ends
      {"unmatched", "", kAldo, "rejection"},        // m12 newsletter: the profile, no employer
      {"matched", "V0104", kKemi, "rejection"},     // m13 negated invitation
      {"duplicate", "", "", ""},                    // m01 copy in cur/
      {"duplicate", "", "", ""},                    // m11 in cur/
  };
  REQUIRE(sum.messages.size() == expected.size());
  for (size_t i = 0; i < expected.size(); ++i) {
    const auto& m = sum.messages[i];
    const auto& e = expected[i];
    INFO("message " << i << " at " << m.where << ": " << m.reason);
    CHECK(m.status == e.status);
    if (e.status == "duplicate") continue;
    CHECK(m.profile == e.profile);
    CHECK(m.suggested_code == e.code);
    if (e.status == "matched")
      CHECK(m.probe_ref == mailtest::ProbeFor(*store, e.vacancy, e.profile));
    else
      CHECK(m.probe_ref.empty());
  }
  CHECK(sum.messages[10].message == sum.messages[0].message);
  CHECK(sum.messages[11].message == sum.messages[7].message);
  CHECK(sum.messages[14].message == sum.messages[0].message);

  // Nothing but the log: no response, no decision; one audit entry.
  CHECK(store->QueryInt("SELECT count(*) FROM mail_message") == 12);
  CHECK(store->QueryInt("SELECT count(*) FROM response") == 0);
  CHECK(store->QueryInt("SELECT count(*) FROM review_decision") == 0);
  Stmt audit = store->Prepare("SELECT command, summary FROM audit ORDER BY seq DESC LIMIT 1");
  REQUIRE(audit.Step());
  CHECK(audit.Text(0) == "mail");
  CHECK(audit.Text(1) == "mail from mbox:" + s.study + "/mail/inbox.mbox, maildir:" + s.study +
                             "/mail/Maildir: 16 read, 12 stored (9 matched to a probe, 3 to assign), 4 stored before; "
                             "all wait for review");
  CHECK(VerifyAudit(*store).ok());
}

TEST_CASE("mail intake: reading the same mailboxes again changes nothing") {
  PlannedMailStudy s;
  auto store = s.Open();
  REQUIRE(IngestMail(*store, FixtureRules(s.study), FixtureBatches(s.study)).ok());
  const std::string head = AuditHead(*store);
  const int64_t entries = store->QueryInt("SELECT count(*) FROM audit");
  auto again = IngestMail(*store, FixtureRules(s.study), FixtureBatches(s.study));
  REQUIRE(again.ok());
  CHECK(again.value().stored == 0);
  CHECK(again.value().duplicates == 16);
  CHECK(again.value().audit_hash.empty());
  CHECK(AuditHead(*store) == head);
  CHECK(store->QueryInt("SELECT count(*) FROM audit") == entries);
  CHECK(store->QueryInt("SELECT count(*) FROM mail_message") == 12);
}

TEST_CASE("mail intake: keys, digests and what the sealed columns hold") {
  PlannedMailStudy s;
  auto store = s.Open();
  REQUIRE(IngestMail(*store, FixtureRules(s.study), FixtureBatches(s.study)).ok());
  CHECK(MailKey("<20270304.invite.0101@orlinde-bakehouse.example>", "x") ==
        "mid:" + Sha256Hex("20270304.invite.0101@orlinde-bakehouse.example"));
  CHECK(MailKey("", "Subject: a\r\n\r\nb\r\n") == "raw:" + Sha256Hex("Subject: a\n\nb\n"));

  Stmt first = store->Prepare(
      "SELECT message_id, mailbox, from_addr, to_addr, subject, sent_date, body_sha256, excerpt, match_reason, "
      "suggested_code, evidence FROM mail_message WHERE id = 1");
  REQUIRE(first.Step());
  CHECK(first.Text(0) == "mid:" + Sha256Hex("20270304.invite.0101@orlinde-bakehouse.example"));
  CHECK(first.Text(1) == "mbox:" + s.study + "/mail/inbox.mbox");
  // Keyed under the study's secret (purge deletes it), so a guessed address
  // cannot be confirmed against the sealed digest once the study is purged.
  Stmt secret_row = store->Prepare("SELECT value FROM secret WHERE name = 'employer_key'");
  REQUIRE(secret_row.Step());
  const std::string secret = secret_row.Text(0);
  CHECK(first.Text(2) == "hmac:" + HmacSha256Hex(secret, "hanne.ostrel@orlinde-bakehouse.example"));
  CHECK(first.Text(3) == kAldo);
  CHECK(first.Text(4) == "hmac:" + HmacSha256Hex(secret, "Your application: baker's assistant (V0101)"));
  CHECK(first.Text(5) == "2027-03-04T09:15:00Z");
  auto mbox = ReadMbox(s.study + "/mail/inbox.mbox");
  CHECK(first.Text(6) == Sha256Hex(CanonicalRaw(mbox.value()[0].raw)));
  auto excerpt = nlohmann::json::parse(first.Text(7));
  CHECK(excerpt["subject"] == "Your application: baker's assistant (V0101)");
  CHECK(excerpt["from"] == "Hanne Ostrel <hanne.ostrel@orlinde-bakehouse.example>");
  CHECK(excerpt["contexts"].size() == 1);
  CHECK(excerpt["text"].get<std::string>().rfind("Dear Aldo Brenvik, Thank you for your application.", 0) == 0);
  CHECK(first.Text(8).rfind("matched: for profile aldo.brenvik@postbox.example; vacancy reference V0101", 0) == 0);
  CHECK(first.Text(9) == "invitation");
  auto evidence = nlohmann::json::parse(first.Text(10));
  CHECK(evidence["match"] == "matched");
  CHECK(evidence["phrases"][0]["phrase"] == "invite you to an interview");

  // A forward carries the forwarded message's date, and says so.
  Stmt fwd = store->Prepare("SELECT sent_date, evidence FROM mail_message WHERE id = 7");
  REQUIRE(fwd.Step());
  CHECK(fwd.Text(0) == "2027-03-09T07:00:00Z");
  CHECK(nlohmann::json::parse(fwd.Text(1))["date"] == "forwarded");
  CHECK(evidence["date"] == "header");

  Stmt nomid = store->Prepare("SELECT message_id FROM mail_message WHERE id = 8");
  REQUIRE(nomid.Step());
  CHECK(nomid.Text(0) == "raw:" + Sha256Hex(CanonicalRaw(mbox.value()[7].raw)));
  // Sealed columns hold no sender address or subject in clear text, and no
  // employer name: those live in the purgeable excerpt only.
  CHECK(store->QueryInt(
            "SELECT count(*) FROM mail_message WHERE from_addr NOT LIKE 'hmac:%' OR subject NOT LIKE 'hmac:%'") ==
        0);
  CHECK(store->QueryInt("SELECT count(*) FROM mail_message WHERE match_reason LIKE '%bakehouse%' OR "
                        "match_reason LIKE '%@kestrel%' OR evidence LIKE '%Hanne%'") == 0);
}

TEST_CASE("mail intake: the audit chain seals the log, the excerpt alone may be purged") {
  PlannedMailStudy s;
  auto store = s.Open();
  REQUIRE(IngestMail(*store, FixtureRules(s.study), FixtureBatches(s.study)).ok());
  store->Exec("UPDATE mail_message SET excerpt = NULL");
  CHECK(VerifyAudit(*store).ok());
  store->Exec("UPDATE mail_message SET suggested_code = 'offer' WHERE id = 2");
  AuditReport report = VerifyAudit(*store);
  REQUIRE_FALSE(report.ok());
  CHECK(report.problems.front().what.find("rows written by this entry (mail) were changed") != std::string::npos);
}

TEST_CASE("mail intake: a message for a study without a plan waits unmatched") {
  testing::TempDir dir;
  auto store = Store::Open(dir / "study.db", true);
  REQUIRE(store.ok());
  MailRules rules;
  rules.suggest = {{"invitation", {"invite you"}, {}}};
  RawMail raw{"Message-ID: <a@b.example>\nTo: aldo.brenvik@postbox.example\n\nWe invite you.\n", "x:1", std::nullopt};
  auto r = IngestMail(*store.value(), rules, {{"mbox", "x", {raw}}});
  REQUIRE(r.ok());
  CHECK(r.value().queued == 1);
  CHECK(r.value().messages[0].suggested_code == "invitation");
  CHECK(store.value()->QueryInt("SELECT count(*) FROM mail_message WHERE sent_date IS NULL") == 1);
}
