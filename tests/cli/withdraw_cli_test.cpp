// `withdraw` end to end (cli/withdraw_cmd.cpp, collector/withdrawals.h):
// the schedule, `sent`, the analysis and the flow table all follow the one
// withdrawal record, and responses already recorded stay.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// The demo plan's probes of one vacancy, reference arm first.
std::vector<std::string> ProbesOf(const testing::PlannedStudy& s, const std::string& vacancy) {
  auto store = s.Open();
  Stmt q = store->Prepare(
      "SELECT p.ref FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "WHERE v.ref = ?1 ORDER BY a.is_reference DESC, p.id");
  q.Bind(1, vacancy);
  std::vector<std::string> out;
  while (q.Step()) out.push_back(q.Text(0));
  return out;
}

bool Lists(const nlohmann::json& schedule, const std::string& probe) {
  for (const auto& p : schedule["probes"])
    if (p["probe"] == probe) return true;
  return false;
}

std::string FirstText(Store& store, const std::string& sql) {
  Stmt q = store.Prepare(sql);
  REQUIRE(q.Step());
  return q.Text(0);
}

const std::vector<std::string> kNow = {"TWINPROBE_NOW=2027-05-01T12:00:00Z"};

}  // namespace

TEST_CASE("withdraw: the unsent probe leaves the schedule, sent refuses it, the response stays") {
  testing::PlannedStudy s;
  const auto probes = ProbesOf(s, "V0001");
  REQUIRE(probes.size() == 2);
  const std::string& sent = probes[0];
  const std::string& unsent = probes[1];
  REQUIRE(RunCli({"--study", s.path, "sent", sent, "--at", "2027-03-01T09:00"}, kNow).exit_code == 0);
  REQUIRE(RunCli({"--study", s.path, "record", sent, "rejection", "--at", "2027-03-03"}, kNow).exit_code == 0);
  const auto before = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "schedule"}, kNow).out);
  CHECK(Lists(before, unsent));

  auto w = RunCli({"--study", s.path, "withdraw", "V0001", "--reason", "the posting closed", "--at", "2027-03-04"},
                  kNow);
  INFO(w.err);
  CHECK(w.exit_code == 0);
  CHECK(w.out ==
        "Withdrew vacancy V0001 at 2027-03-04T00:00:00Z (the posting closed).\n"
        "1 unsent application leaves the schedule; 'twinprobe sent' refuses it.\n"
        "Its set leaves the primary analysis and is counted as withdrawn in the flow of the study.\n"
        "1 response already recorded stays in the store and in 'twinprobe history'.\n" +
            testing::HeadLine(s.path));

  const auto after = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "schedule"}, kNow).out);
  CHECK_FALSE(Lists(after, unsent));
  CHECK(after["count"] == before["count"].get<int>() - 1);
  const auto all = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "schedule", "--all"}, kNow).out);
  CHECK(Lists(all, sent));  // what was sent stays listed with --all
  CHECK_FALSE(Lists(all, unsent));

  const std::string fingerprint = testing::FingerprintOf(s.db());
  auto refused = RunCli({"--study", s.path, "sent", unsent, "--at", "2027-03-05"}, kNow);
  CHECK(refused.exit_code == 1);
  CHECK(refused.err == "twinprobe: " + unsent +
                           " belongs to vacancy V0001, withdrawn at 2027-03-04T00:00:00Z (the posting closed), so it "
                           "is not to be sent \u2014 send only what 'twinprobe schedule' lists; a withdrawn vacancy's "
                           "unsent applications are left out\n");
  CHECK(testing::FingerprintOf(s.db()) == fingerprint);
  // A sent probe's time may still be corrected.
  CHECK(RunCli({"--study", s.path, "sent", sent, "--at", "2027-03-01T10:00"}, kNow).exit_code == 0);

  auto history = RunCli({"--study", s.path, "--json", "history", sent}, kNow);
  INFO(history.err);
  CHECK(history.out.find("\"code\": \"rejection\"") != std::string::npos);

  const auto j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "analyze"}, kNow).out);
  CHECK(j["flow"]["excluded"][3]["reason"] == "withdrawn");
  CHECK(j["flow"]["excluded"][3]["label"] == "vacancy withdrawn");
  CHECK(j["flow"]["excluded"][3]["sets"] == 1);
  CHECK(j["flow"]["excluded"][0]["sets"] == 399);  // not sent
  CHECK(j["flow"]["sets_sent"] == 0);
  CHECK(j["counts"]["sets_analysed"] == 0);
  CHECK(j["counts"]["probes_sent"] == 1);  // it was sent: the fieldwork's facts stay
  CHECK(j["counts"]["responses"] == 1);
  const auto text = RunCli({"--study", s.path, "analyze"}, kNow).out;
  CHECK(text.find("  400 vacancies planned\n    399 sets left out: no application sent yet\n"
                  "    1 set left out: vacancy withdrawn\n  0 sets with every application sent\n") !=
        std::string::npos);
}

TEST_CASE("withdraw: a set sent and answered in full leaves the analysis") {
  testing::PlannedStudy s;
  for (const char* v : {"V0001", "V0002"}) {
    for (const std::string& p : ProbesOf(s, v)) {
      REQUIRE(RunCli({"--study", s.path, "sent", p, "--at", "2027-03-01T09:00"}, kNow).exit_code == 0);
      REQUIRE(RunCli({"--study", s.path, "record", p, "invitation", "--at", "2027-03-02"}, kNow).exit_code == 0);
    }
  }
  auto j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "analyze"}, kNow).out);
  CHECK(j["counts"]["sets_analysed"] == 2);
  CHECK(j["paired"]["table"]["a"] == 2);
  REQUIRE(RunCli({"--study", s.path, "withdraw", "V0002", "--reason", "the employer saw through the test"}, kNow)
              .exit_code == 0);
  j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "analyze"}, kNow).out);
  CHECK(j["counts"]["sets_analysed"] == 1);
  CHECK(j["paired"]["table"]["a"] == 1);
  CHECK(j["arms"][0]["probes"] == 1);
  CHECK(j["flow"]["sets_sent"] == 1);
  CHECK(j["flow"]["sets_closed"] == 1);
  CHECK(j["flow"]["excluded"][3]["sets"] == 1);
  CHECK(j["counts"]["responses"] == 4);  // kept in the store
  // Without --at the withdrawal is dated by the study clock.
  auto store = s.Open();
  CHECK(FirstText(*store, "SELECT withdrawn_at FROM withdrawal") == "2027-05-01T12:00:00Z");
}

TEST_CASE("withdraw: a second withdrawal says already withdrawn and writes nothing") {
  testing::PlannedStudy s;
  REQUIRE(RunCli({"--study", s.path, "withdraw", "V0003", "--reason", "an error in the listing", "--at",
                  "2027-03-04T10:00"})
              .exit_code == 0);
  const std::string fingerprint = testing::FingerprintOf(s.db());
  auto again = RunCli({"--study", s.path, "withdraw", "V0003", "--reason", "the posting closed"});
  CHECK(again.exit_code == 0);
  CHECK(again.out == "Vacancy V0003 was already withdrawn at 2027-03-04T10:00:00Z (an error in the listing); "
                     "nothing recorded.\n");
  CHECK(testing::FingerprintOf(s.db()) == fingerprint);
  auto j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "withdraw", "V0003", "--reason", "x"}).out);
  CHECK(j["already_withdrawn"] == true);
  CHECK(j["reason"] == "an error in the listing");
  CHECK(j["unsent_probes"] == 2);
}

TEST_CASE("withdraw: an unknown vacancy, an empty reason and a bad time are refused, store unchanged") {
  testing::PlannedStudy s;
  const std::string fingerprint = testing::FingerprintOf(s.db());
  auto unknown = RunCli({"--study", s.path, "withdraw", "V0O12", "--reason", "the posting closed"});
  CHECK(unknown.exit_code == 1);
  CHECK(unknown.err == "twinprobe: unknown vacancy 'V0O12' (did you mean 'V0012'?) \u2014 use a vacancy reference "
                       "from 'twinprobe schedule' (its VACANCY column)\n");
  auto empty = RunCli({"--study", s.path, "withdraw", "V0012", "--reason", "  "});
  CHECK(empty.exit_code == 1);
  CHECK(empty.err == "twinprobe: a withdrawal needs a reason \u2014 say why with --reason, e.g. --reason \"the "
                     "posting closed before the second application\"\n");
  auto lines = RunCli({"--study", s.path, "withdraw", "V0012", "--reason", "closed\nreopened"});
  CHECK(lines.exit_code == 1);
  CHECK(lines.err == "twinprobe: the reason holds a line break or control character \u2014 write the reason on one "
                     "line of plain text\n");
  auto time = RunCli({"--study", s.path, "withdraw", "V0012", "--reason", "closed", "--at", "soon"});
  CHECK(time.exit_code == 1);
  CHECK(time.err == "twinprobe: 'soon' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)\n");
  CHECK(testing::FingerprintOf(s.db()) == fingerprint);
}

TEST_CASE("withdraw: verify rebuilds the audit summary from the sealed withdrawal") {
  testing::PlannedStudy s;
  REQUIRE(RunCli({"--study", s.path, "withdraw", "V0004", "--reason", "the posting closed", "--at", "2027-03-04"})
              .exit_code == 0);
  {
    auto store = s.Open();
    CHECK(FirstText(*store, "SELECT summary FROM audit ORDER BY seq DESC LIMIT 1") ==
          "withdraw V0004 at 2027-03-04T00:00:00Z: the posting closed");
  }
  auto ok = RunCli({"--study", s.path, "--json", "verify"});
  INFO(ok.out << ok.err);
  CHECK(nlohmann::json::parse(ok.out)["ok"] == true);
  // A reason changed after sealing is found twice: by the row's digest and by the summary.
  s.Open()->Exec("UPDATE withdrawal SET reason = 'an error in the listing'");
  auto bad = RunCli({"--study", s.path, "verify"});
  CHECK(bad.exit_code == 1);
  CHECK(bad.out.find("its summary says 'withdraw V0004 at 2027-03-04T00:00:00Z: the posting closed' but the rows "
                     "it sealed say 'withdraw V0004 at 2027-03-04T00:00:00Z: an error in the listing'") !=
        std::string::npos);
}
