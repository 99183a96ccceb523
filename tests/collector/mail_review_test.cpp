// `review` at the store level: decisions become normal responses (through
// AddResponse) plus a review_decision row, one audited write each.
#include "collector/mail_review.h"

#include <catch2/catch.hpp>

#include "collector/mail_intake.h"
#include "collector/responses.h"
#include "core/audit.h"
#include "mail_fixture.h"
#include "planner/design_file.h"

using namespace twinprobe;
using mailtest::PlannedMailStudy;

namespace {

const std::string kAldo = "aldo.brenvik@postbox.example", kKemi = "kemi.saralon@postbox.example";

// The fixture study with its mailboxes read (message numbers as in
// mail_intake_test: 1 = m01 invitation, 2 = m02 rejection, 9 = m10 no
// profile, 10 = m11 ambiguous, 11 = m12 newsletter).
struct ReadStudy : PlannedMailStudy {
  std::unique_ptr<Store> store;
  Design design;
  explicit ReadStudy(bool send_all = true) {
    if (send_all) SendAll();
    store = Open();
    auto d = LoadDesign(study);
    REQUIRE(d.ok());
    design = d.value();
    auto mbox = ReadMbox(study + "/mail/inbox.mbox");
    auto maildir = ReadMaildir(study + "/mail/Maildir");
    REQUIRE(
        IngestMail(*store, design.mail, {{"mbox", "inbox.mbox", mbox.value()}, {"maildir", "Maildir", maildir.value()}})
            .ok());
  }
  Result<ReviewOutcome> Decide(int64_t message, ReviewAction action, std::string code = "", std::string probe = "",
                               std::string at = "") {
    ReviewRequest r;
    r.message = message;
    r.action = action;
    r.code = std::move(code);
    r.probe_ref = std::move(probe);
    r.at = std::move(at);
    return DecideReview(*store, design.outcomes, r);
  }
};

}  // namespace

TEST_CASE("mail review: the queue shows each message with its evidence") {
  ReadStudy s;
  const std::string& study = s.study;
  auto queue = LoadReviewQueue(*s.store, false);
  REQUIRE(queue.size() == 12);
  const ReviewItem& first = queue[0];
  CHECK(first.message == 1);
  CHECK(first.status == "matched");
  CHECK(first.probe_ref == mailtest::ProbeFor(*s.store, "V0101", kAldo));
  CHECK(first.profile == kAldo);
  CHECK(first.employer_key.rfind("E-", 0) == 0);
  CHECK(first.subject == "Your application: baker's assistant (V0101)");
  CHECK(first.from == "Hanne Ostrel <hanne.ostrel@orlinde-bakehouse.example>");
  CHECK(first.date == "2027-03-04T09:15:00Z");
  CHECK(first.suggested_code == "invitation");
  REQUIRE(first.evidence.size() == 1);
  CHECK(first.evidence[0].phrase == "invite you to an interview");
  // 60 code points either side of the phrase (cut the same way in Python).
  CHECK(first.evidence[0].context ==
        "\u2026o Brenvik, Thank you for your application. We would like to invite you to an interview on Tuesday 9 "
        "March at 10:00 at our shop on Mill Lane. From \u2026");
  CHECK(first.where == study + "/mail/inbox.mbox:1");
  CHECK(first.source == "mbox:inbox.mbox");
  CHECK_FALSE(first.purged);

  const ReviewItem& ambiguous = queue[9];
  CHECK(ambiguous.status == "ambiguous");
  CHECK(ambiguous.probe_ref.empty());
  CHECK(ambiguous.employer_key.empty());
  REQUIRE(ambiguous.candidates.size() == 2);
  CHECK(ambiguous.candidates[0] == mailtest::ProbeFor(*s.store, "V0102", kKemi) + " (reference)");
}

TEST_CASE("mail review: confirming records the suggestion as a normal response, once") {
  ReadStudy s;
  const std::string probe = mailtest::ProbeFor(*s.store, "V0101", kAldo);
  auto r = s.Decide(1, ReviewAction::kConfirm);
  INFO((r.ok() ? "" : r.error().Message()));
  REQUIRE(r.ok());
  CHECK(r.value().decision == ReviewDecision::kConfirmed);
  CHECK(r.value().probe_ref == probe);
  CHECK(r.value().code == "invitation");
  CHECK(r.value().received_at == "2027-03-04T09:15:00Z");
  CHECK(r.value().positive);
  CHECK(r.value().warnings.empty());

  Stmt resp = s.store->Prepare(
      "SELECT p.ref, r.code, r.received_at, r.channel, r.origin, r.note FROM response r JOIN probe p ON p.id = "
      "r.probe_id");
  REQUIRE(resp.Step());
  CHECK(resp.Text(0) == probe);
  CHECK(resp.Text(1) == "invitation");
  CHECK(resp.Text(2) == "2027-03-04T09:15:00Z");
  CHECK(resp.Text(3) == "mail");
  CHECK(resp.Text(4) == "mail-review");
  CHECK(resp.Text(5) == "mail message 1");
  CHECK_FALSE(resp.Step());
  Stmt dec = s.store->Prepare("SELECT decision, response_id FROM review_decision WHERE mail_message_id = 1");
  REQUIRE(dec.Step());
  CHECK(dec.Text(0) == "confirmed");
  CHECK(dec.Int(1) == r.value().response_id);
  Stmt audit = s.store->Prepare("SELECT command, summary FROM audit ORDER BY seq DESC LIMIT 1");
  REQUIRE(audit.Step());
  CHECK(audit.Text(0) == "review");
  CHECK(audit.Text(1) == "review message 1: confirmed invitation for " + probe);
  CHECK(LoadReviewQueue(*s.store, false).size() == 11);
  CHECK(LoadReviewQueue(*s.store, true).size() == 12);
  CHECK(VerifyAudit(*s.store).ok());

  auto again = s.Decide(1, ReviewAction::kDismiss);
  REQUIRE_FALSE(again.ok());
  CHECK(again.error().Message().rfind("message 1 was reviewed before (confirmed by ", 0) == 0);
  CHECK(s.store->QueryInt("SELECT count(*) FROM review_decision") == 1);
}

TEST_CASE("mail review: a changed code, an assigned probe and a dismissal") {
  ReadStudy s;
  auto changed = s.Decide(2, ReviewAction::kCode, "info_request");
  REQUIRE(changed.ok());
  CHECK(changed.value().decision == ReviewDecision::kChanged);
  CHECK(changed.value().code == "info_request");

  const std::string p = mailtest::ProbeFor(*s.store, "V0102", kKemi);
  auto assigned = s.Decide(10, ReviewAction::kConfirm, "", p);
  REQUIRE(assigned.ok());
  CHECK(assigned.value().decision == ReviewDecision::kChanged);  // it had no probe; a person chose one
  CHECK(assigned.value().code == "info_request");
  CHECK(assigned.value().probe_ref == p);

  auto dismissed = s.Decide(9, ReviewAction::kDismiss);
  REQUIRE(dismissed.ok());
  CHECK(dismissed.value().decision == ReviewDecision::kDismissed);
  CHECK(dismissed.value().response_id == 0);
  CHECK(s.store->QueryInt("SELECT count(*) FROM response") == 2);
  CHECK(s.store->QueryInt(
            "SELECT count(*) FROM review_decision WHERE decision = 'dismissed' AND response_id IS NULL") == 1);
  CHECK(VerifyAudit(*s.store).ok());
}

TEST_CASE("mail review: a second response to a probe supersedes the first, both kept") {
  ReadStudy s;
  const std::string probe = mailtest::ProbeFor(*s.store, "V0101", kAldo);
  REQUIRE(MarkSent(*s.store, probe, "2027-03-01T10:00").ok());  // a response needs a sending
  REQUIRE(RecordResponse(*s.store, s.design.outcomes, {probe, "rejection", "2027-03-03", "phone", "", "record"}).ok());
  auto r = s.Decide(1, ReviewAction::kConfirm);
  REQUIRE(r.ok());
  CHECK(r.value().superseded == 1);
  CHECK(s.store->QueryInt("SELECT count(*) FROM current_response") == 1);
  CHECK(s.store->QueryInt("SELECT count(*) FROM response") == 2);
}

TEST_CASE("mail review: refusals name the fix and leave the store unchanged") {
  ReadStudy s;
  const std::string head = AuditHead(*s.store);
  auto unmatched = s.Decide(10, ReviewAction::kConfirm);
  REQUIRE_FALSE(unmatched.ok());
  CHECK(unmatched.error().Message() ==
        "message 10 is not matched to one probe (ambiguous) \u2014 assign it: "
        "'twinprobe review 10 --probe P00012 --code CODE' (or --confirm)");
  auto missing = s.Decide(99, ReviewAction::kConfirm);
  REQUIRE_FALSE(missing.ok());
  CHECK(missing.error().Message() == "there is no mail message 99 \u2014 run 'twinprobe review' to list the queue");
  auto bad_code = s.Decide(1, ReviewAction::kCode, "invitaton");
  REQUIRE_FALSE(bad_code.ok());
  CHECK(bad_code.error().what == "'invitaton' is not a response code of this study (did you mean 'invitation'?)");
  auto bad_probe = s.Decide(9, ReviewAction::kCode, "invitation", "P99999");
  REQUIRE_FALSE(bad_probe.ok());
  CHECK(bad_probe.error().what == "unknown probe 'P99999'");
  auto dismiss_with_probe = s.Decide(9, ReviewAction::kDismiss, "", "P00001");
  REQUIRE_FALSE(dismiss_with_probe.ok());
  CHECK(dismiss_with_probe.error().what == "--probe and --at do not go with --dismiss");
  // A response cannot precede the application.
  const std::string probe = mailtest::ProbeFor(*s.store, "V0101", kAldo);
  REQUIRE(MarkSent(*s.store, probe, "2027-03-05T08:00").ok());
  const std::string head_after_sent = AuditHead(*s.store);
  auto early = s.Decide(1, ReviewAction::kConfirm);
  REQUIRE_FALSE(early.ok());
  CHECK(early.error().what ==
        "the response time 2027-03-04T09:15:00Z of " + probe + " is before its sending (2027-03-05T08:00:00Z)");
  CHECK(AuditHead(*s.store) == head_after_sent);
  CHECK(head_after_sent != head);
  CHECK(s.store->QueryInt("SELECT count(*) FROM response") == 0);
  CHECK(s.store->QueryInt("SELECT count(*) FROM review_decision") == 0);
  // With the right time given by hand it goes through.
  auto fixed = s.Decide(1, ReviewAction::kConfirm, "", "", "2027-03-05T09:15");
  REQUIRE(fixed.ok());
  CHECK(fixed.value().received_at == "2027-03-05T09:15:00Z");
}

TEST_CASE("issue 17: a message matched to a probe with no sending is not recorded and stays in the queue") {
  ReadStudy s(false);
  const std::string probe = mailtest::ProbeFor(*s.store, "V0101", kAldo);
  const std::string head = AuditHead(*s.store);
  auto r = s.Decide(1, ReviewAction::kConfirm);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() ==
        "message 1 is matched to " + probe +
            ", which has no sending recorded, so it was not recorded as a response and stays in the queue \u2014 "
            "record the sending first with 'twinprobe sent " +
            probe + " --at TIME' (or 'twinprobe import sendings FILE.csv'), then review message 1 again");
  CHECK(AuditHead(*s.store) == head);
  CHECK(s.store->QueryInt("SELECT count(*) FROM response") == 0);
  CHECK(LoadReviewQueue(*s.store, false).size() == 12);
  // Once the sending is on record, the same decision goes through.
  REQUIRE(MarkSent(*s.store, probe, "2027-03-01").ok());
  auto again = s.Decide(1, ReviewAction::kConfirm);
  REQUIRE(again.ok());
  CHECK(again.value().received_at == "2027-03-04T09:15:00Z");
}

TEST_CASE("mail review: a probe of another profile is allowed with a warning") {
  ReadStudy s;
  const std::string other = mailtest::ProbeFor(*s.store, "V0101", kKemi);
  auto r = s.Decide(1, ReviewAction::kConfirm, "", other);
  REQUIRE(r.ok());
  REQUIRE(r.value().warnings.size() == 1);
  CHECK(r.value().warnings[0] ==
        other + " belongs to profile kemi.saralon@postbox.example, but the message was for " + kAldo);
}

TEST_CASE("mail review: a message without a date needs --at, without a suggestion needs --code") {
  PlannedMailStudy s;
  auto store = s.Open();
  MailRules rules;
  RawMail raw{
      "Message-ID: <nodate@orlinde-bakehouse.example>\nFrom: jobs@orlinde-bakehouse.example\n"
      "To: aldo.brenvik@postbox.example\n\nPlease phone us.\n",
      "x:1", std::nullopt};
  REQUIRE(IngestMail(*store, rules, {{"mbox", "x", {raw}}}).ok());
  OutcomeScheme scheme;
  auto no_code = DecideReview(*store, scheme, {1, ReviewAction::kConfirm, "", "", ""});
  REQUIRE_FALSE(no_code.ok());
  CHECK(no_code.error().Message() ==
        "no code was suggested for message 1 \u2014 give one: 'twinprobe review 1 --code CODE'");
  auto no_date = DecideReview(*store, scheme, {1, ReviewAction::kCode, "info_request", "", ""});
  REQUIRE_FALSE(no_date.ok());
  CHECK(no_date.error().Message() ==
        "message 1 carries no date \u2014 give the time it arrived: --at YYYY-MM-DDTHH:MM");
  store.reset();
  s.SendAll();
  store = s.Open();
  auto ok = DecideReview(*store, scheme, {1, ReviewAction::kCode, "info_request", "", "2027-03-06"});
  REQUIRE(ok.ok());
  CHECK(ok.value().decision == ReviewDecision::kChanged);
}

TEST_CASE("mail review: after purge the queue still shows the sealed facts") {
  ReadStudy s;
  s.store->Exec("UPDATE mail_message SET excerpt = NULL");
  auto item = LoadReviewItem(*s.store, 1);
  REQUIRE(item.ok());
  CHECK(item.value().purged);
  CHECK(item.value().subject.empty());
  CHECK(item.value().suggested_code == "invitation");
  REQUIRE(item.value().evidence.size() == 1);
  CHECK(item.value().evidence[0].phrase == "invite you to an interview");
  CHECK(item.value().evidence[0].context.empty());
  CHECK(VerifyAudit(*s.store).ok());
}
