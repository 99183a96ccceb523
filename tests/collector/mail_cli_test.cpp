// `twinprobe mail` and `twinprobe review` end to end: the real binary on the
// planned fixture study, with standard input at /dev/null (no prompts).
#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include "core/audit.h"
#include "mail_fixture.h"

using namespace twinprobe;
using mailtest::PlannedMailStudy;
using testing::RunCli;

namespace {

bool Contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

std::string Head(const std::string& study) {
  return nlohmann::json::parse(RunCli({"--study", study, "--json", "verify"}).out)["head_hash"].get<std::string>();
}

}  // namespace

TEST_CASE("mail cli: reads the design's mailboxes, logs, and records no response") {
  PlannedMailStudy s;
  auto r = RunCli({"--study", s.study, "mail"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.err.empty());
  CHECK(r.out.rfind("Read 16 messages from 2 mailboxes: " + s.study + "/mail/inbox.mbox (11) " + s.study +
                        "/mail/Maildir (5).\nStored 12 new; 4 stored before (same Message-ID or content).\n"
                        "Matched to a probe (9); each suggestion waits for a person to confirm it:\n",
                    0) == 0);
  CHECK(Contains(r.out, "To assign by hand (3), no single probe fits:\n"));
  CHECK(Contains(r.out,
                 "  message 9  unmatched  no profile's mailbox is among the recipients, the senders or the text\n"));
  CHECK(Contains(r.out, "No response was recorded. Next: 'twinprobe --study " + s.study + " review' shows the queue with the evidence.\n"));
  auto store = s.Open();
  CHECK(store->QueryInt("SELECT count(*) FROM response") == 0);
  CHECK(store->QueryInt("SELECT count(*) FROM mail_message") == 12);

  auto again = RunCli({"--study", s.study, "--json", "mail"});
  REQUIRE(again.exit_code == 0);
  auto j = nlohmann::json::parse(again.out);
  CHECK(j["stored"] == 0);
  CHECK(j["duplicates"] == 16);
  CHECK(j["audit_hash"].is_null());
  CHECK(j["messages"][0]["status"] == "duplicate");
  auto text = RunCli({"--study", s.study, "mail", "--maildir", s.study + "/mail/Maildir"});
  CHECK(text.out == "Read 5 messages from 1 mailbox: " + s.study +
                        "/mail/Maildir (5).\n"
                        "Nothing new: every message was stored before; the store is unchanged.\n");
}

TEST_CASE("mail cli: --json lists every message with its match") {
  PlannedMailStudy s;
  auto r = RunCli({"--study", s.study, "--json", "mail", "--mbox", s.study + "/mail/inbox.mbox"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["read"] == 11);
  CHECK(j["stored"] == 10);
  CHECK(j["duplicates"] == 1);
  CHECK(j["matched"] == 8);
  CHECK(j["queued"] == 2);
  CHECK(j["sources"] ==
        nlohmann::json::parse(R"([{"kind":"mbox","source":")" + s.study + R"(/mail/inbox.mbox","messages":11}])"));
  const auto& first = j["messages"][0];
  auto store = s.Open();
  CHECK(first["message"] == 1);
  CHECK(first["status"] == "matched");
  CHECK(first["probe"] == mailtest::ProbeFor(*store, "V0101", "aldo.brenvik@postbox.example"));
  CHECK(first["profile"] == "aldo.brenvik@postbox.example");
  CHECK(first["suggested_code"] == "invitation");
  CHECK(first["where"] == s.study + "/mail/inbox.mbox:1");
  CHECK(j["messages"][8]["probe"].is_null());
  CHECK(j["messages"][8]["profile"].is_null());
  CHECK(j["audit_hash"].get<std::string>().size() == 64);
}

TEST_CASE("mail cli: bad input is one line, exit 1 or 2, and the store unchanged") {
  PlannedMailStudy s;
  const std::string head = Head(s.study);
  auto missing = RunCli({"--study", s.study, "mail", "--mbox", s.study + "/nothing.mbox"});
  CHECK(missing.exit_code == 1);
  CHECK(missing.err == "twinprobe: " + s.study + "/nothing.mbox: cannot read the mbox file \u2014 check the path\n");
  auto not_mbox = RunCli({"--study", s.study, "mail", "--mbox", s.study + "/vacancies.csv"});
  CHECK(not_mbox.exit_code == 1);
  CHECK(not_mbox.err ==
        "twinprobe: " + s.study +
            "/vacancies.csv:1:1: this is not an mbox file: it does not start "
            "with a 'From ' line \u2014 pass a Maildir folder with --maildir, or export the mailbox in mbox format\n");
  // One bad mailbox among good ones: nothing is stored.
  auto mixed =
      RunCli({"--study", s.study, "mail", "--maildir", s.study + "/mail/Maildir", "--maildir", s.study + "/names"});
  CHECK(mixed.exit_code == 1);
  CHECK(Head(s.study) == head);

  std::string toml = testing::ReadFile(s.study + "/study.toml");
  std::string no_boxes = toml;
  const std::string boxes = "mbox = [\"mail/inbox.mbox\"]\nmaildir = [\"mail/Maildir\"]\n";
  no_boxes.replace(no_boxes.find(boxes), boxes.size(), "");
  testing::WriteFile(s.study + "/study.toml", no_boxes);
  auto none = RunCli({"--study", s.study, "mail"});
  CHECK(none.exit_code == 2);
  CHECK(none.err ==
        "twinprobe: no mailbox to read \u2014 give --mbox FILE, --maildir DIR or --imap URL, or list "
        "mailboxes under [mail] in study.toml\n");

  std::string typo = toml;
  typo.replace(typo.find("code = \"info_request\""), 21, "code = \"info_reqest\"");
  testing::WriteFile(s.study + "/study.toml", typo);
  auto bad_rule = RunCli({"--study", s.study, "mail"});
  CHECK(bad_rule.exit_code == 1);
  CHECK(bad_rule.err == "twinprobe: " + s.study +
                            "/study.toml:56:8: 'info_reqest' is not a response code of this "
                            "study (did you mean 'info_request'?) \u2014 use one of: none, rejection, info_request, "
                            "invitation, offer\n");
  CHECK(Head(s.study) == head);
}

TEST_CASE("review cli: lists the queue with evidence, and records decisions as responses") {
  PlannedMailStudy s;
  REQUIRE(RunCli({"--study", s.study, "mail"}).exit_code == 0);
  s.SendAll();
  auto store = s.Open();
  const std::string p1 = mailtest::ProbeFor(*store, "V0101", "aldo.brenvik@postbox.example");
  const std::string p11 = mailtest::ProbeFor(*store, "V0102", "kemi.saralon@postbox.example");
  store.reset();

  auto list = RunCli({"--study", s.study, "review"});
  REQUIRE(list.exit_code == 0);
  CHECK(list.out.rfind("12 messages wait for review (9 matched to a probe, 3 to assign). Nothing is recorded until "
                       "you decide.\n\nmessage 1  matched -> " +
                           p1 +
                           ", suggested: invitation\n"
                           "  date      2027-03-04T09:15:00Z\n"
                           "  source    " +
                           s.study +
                           "/mail/inbox.mbox:1\n"
                           "  profile   aldo.brenvik@postbox.example\n",
                       0) == 0);
  CHECK(Contains(list.out,
                 "  evidence  invitation: \"invite you to an interview\" in the body \u2014 \u2026o Brenvik, "));
  CHECK(Contains(list.out, "  decide    twinprobe review 1 --confirm   (or --code CODE, --probe PROBE, --dismiss)\n"));
  CHECK(Contains(list.out, "  decide    twinprobe review 10 --probe PROBE --confirm   (or --code CODE, --dismiss)\n"));
  CHECK(Contains(list.out, "  date      2027-03-05T11:02:00Z (the forwarded message's date)\n"));
  CHECK(Contains(list.out, "invitation: \"invite you to an interview\" in the body (set aside: negated)"));

  auto one = RunCli({"--study", s.study, "--json", "review", "10"});
  REQUIRE(one.exit_code == 0);
  auto item = nlohmann::json::parse(one.out);
  CHECK(item["status"] == "ambiguous");
  CHECK(item["candidates"].size() == 2);
  CHECK(item["subject"] == "Your applications V0102 and V0104");

  auto confirm = RunCli({"--study", s.study, "review", "1", "--confirm"});
  INFO(confirm.err);
  REQUIRE(confirm.exit_code == 0);
  // The same reminder as `record`: the decline deadline.
  CHECK(confirm.out == "Recorded invitation for " + p1 +
                           " at 2027-03-04T09:15:00Z from message 1 (confirmed as suggested), a positive callback.\n"
                           "Decline the invitation to " +
                           p1 + " by 2027-03-05T09:15:00Z (within 24 hours of receipt) with the letter in " + s.study +
                           "/ethics/letters/decline-invitation.md, then run 'twinprobe --study " + s.study + " decline " +
                           p1 + "'.\n" + testing::HeadLine(s.study));
  CHECK(confirm.err.empty());
  auto assign = RunCli({"--study", s.study, "--json", "review", "10", "--probe", p11, "--code", "info_request"});
  REQUIRE(assign.exit_code == 0);
  auto a = nlohmann::json::parse(assign.out);
  CHECK(a["decision"] == "changed");
  CHECK(a["probe"] == p11);
  CHECK(a["positive"] == true);
  CHECK(a["decline_by"] == "2027-03-12T09:00:00Z");
  auto dismiss = RunCli({"--study", s.study, "review", "9", "--dismiss"});
  CHECK(dismiss.out == "Dismissed message 9; no response was recorded.\n" + testing::HeadLine(s.study));

  auto left = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "review"}).out);
  CHECK(left["waiting"] == 9);
  auto all = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "review", "--all"}).out);
  CHECK(all["messages"].size() == 12);
  CHECK(all["messages"][0]["decision"] == "confirmed");

  store = s.Open();
  CHECK(store->QueryInt("SELECT count(*) FROM response WHERE origin = 'mail-review' AND channel = 'mail'") == 2);
  Stmt audit = store->Prepare("SELECT command FROM audit ORDER BY seq");
  std::vector<std::string> commands;
  while (audit.Step()) commands.push_back(audit.Text(0));
  CHECK(commands == std::vector<std::string>{"plan", "mail", "import sendings", "review", "review", "review"});
  store.reset();
  auto verify = RunCli({"--study", s.study, "verify"});
  CHECK(verify.exit_code == 0);
  CHECK(verify.out.rfind("The audit chain is intact", 0) == 0);
}

TEST_CASE("review cli: usage mistakes exit 2, bad decisions exit 1, nothing written") {
  PlannedMailStudy s;
  REQUIRE(RunCli({"--study", s.study, "mail"}).exit_code == 0);
  s.SendAll();
  const std::string head = Head(s.study);
  auto word = RunCli({"--study", s.study, "review", "first", "--confirm"});
  CHECK(word.exit_code == 2);
  CHECK(word.err ==
        "twinprobe: 'first' is not a message number \u2014 use the number 'twinprobe review' lists, e.g. "
        "'twinprobe review 3 --confirm'\n");
  auto no_number = RunCli({"--study", s.study, "review", "--confirm"});
  CHECK(no_number.exit_code == 2);
  CHECK(no_number.err ==
        "twinprobe: a decision needs the message number \u2014 write 'twinprobe review MESSAGE "
        "--confirm' (the numbers are in 'twinprobe review')\n");
  auto two = RunCli({"--study", s.study, "review", "1", "--confirm", "--dismiss"});
  CHECK(two.exit_code == 2);
  CHECK(two.err == "twinprobe: --confirm, --code and --dismiss exclude one another \u2014 give one of them\n");
  auto probe_only = RunCli({"--study", s.study, "review", "1", "--probe", "P00001"});
  CHECK(probe_only.exit_code == 2);
  CHECK(probe_only.err ==
        "twinprobe: --probe and --at need a decision \u2014 add --confirm (the suggested code) or "
        "--code CODE\n");
  auto unknown = RunCli({"--study", s.study, "review", "99", "--confirm"});
  CHECK(unknown.exit_code == 1);
  CHECK(unknown.err == "twinprobe: there is no mail message 99 \u2014 run 'twinprobe review' to list the queue\n");
  auto bad_code = RunCli({"--study", s.study, "review", "1", "--code", "interview"});
  CHECK(bad_code.exit_code == 1);
  CHECK(bad_code.err.rfind("twinprobe: 'interview' is not a response code of this study", 0) == 0);
  CHECK(Head(s.study) == head);
}

TEST_CASE("review cli: an empty queue says so") {
  PlannedMailStudy s;
  auto r = RunCli({"--study", s.study, "review"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Nothing waits for review. ('twinprobe review --all' lists decided messages too.)\n");
  auto all = RunCli({"--study", s.study, "review", "--all"});
  CHECK(all.out == "No mail has been logged; run 'twinprobe mail' first.\n");
}

TEST_CASE("review cli: a response after the observation window is recorded with the flag 'late' and a warning") {
  PlannedMailStudy s;
  REQUIRE(RunCli({"--study", s.study, "mail"}).exit_code == 0);
  auto store = s.Open();
  const std::string probe = mailtest::ProbeFor(*store, "V0104", "kemi.saralon@postbox.example");
  store.reset();
  // Sent a month before the schedule's start, which the design allows here.
  std::string toml = testing::ReadFile(s.study + "/study.toml");
  testing::WriteFile(s.study + "/study.toml", toml.replace(toml.find("start = \"2027-03-01\""), 20,
                                                           "start = \"2027-03-01\"\nearly_days = 60"));
  REQUIRE(RunCli({"--study", s.study, "sent", probe, "--at", "2027-02-01T09:00"}).exit_code == 0);
  auto r = RunCli({"--study", s.study, "--json", "review", "12", "--confirm"});  // dated 2027-03-12
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["late"] == true);
  CHECK(j["code"] == "rejection");
  CHECK(j["decline_by"].is_null());
  CHECK(r.err.rfind("twinprobe: warning: the response came ", 0) == 0);
  CHECK(Contains(r.err, " days after " + probe +
                            " was sent, outside the observation window of 28 days; it is stored "
                            "with the flag 'late'\n"));
  store = s.Open();
  CHECK(store->QueryInt("SELECT count(*) FROM response WHERE flags LIKE '%late%'") == 1);
}
