// The ethics safeguards as the user meets them: the gate in check/plan, the
// decline reminder, declines, and purge (issue 10).
#include <catch2/catch.hpp>

#include <filesystem>

#include <nlohmann/json.hpp>

#include "core/store.h"
#include "testing/pinned_clock.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

struct Study {
  testing::PinnedClock clock;  // the season's end: fieldwork times may not lie in the future
  testing::TempDir dir;
  std::string path;
  Study() : path(dir / "s") { REQUIRE(RunCli({"--study", path, "init"}).exit_code == 0); }
  void Edit(const std::string& from, const std::string& to) {
    std::string toml = testing::ReadFile(path + "/study.toml");
    auto pos = toml.find(from);
    REQUIRE(pos != std::string::npos);
    testing::WriteFile(path + "/study.toml", toml.replace(pos, from.size(), to));
  }
};

}  // namespace

TEST_CASE("ethics: plan refuses a design without an approval reference and writes nothing") {
  Study s;
  s.Edit("approval = \"VREB-2027-014 (Veldmark Research Ethics Board, invented)\"\n", "");
  auto r = RunCli({"--study", s.path, "plan"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + s.path + "/study.toml: [ethics].approval is missing \u2014 enter the reference of "
                 "your ethics review board's approval (see ethics/README.md)\n");
  CHECK_FALSE(std::filesystem::exists(s.path + "/study.db"));
}

TEST_CASE("ethics: check refuses a design without a cap per employer") {
  Study s;
  s.Edit("cap_per_employer = 2\n", "");
  auto r = RunCli({"--study", s.path, "check"});
  CHECK(r.exit_code == 1);
  CHECK(r.err.find("[ethics].cap_per_employer is missing") != std::string::npos);
}

TEST_CASE("ethics: recording an invitation prints the decline deadline and the letter, decline clears it") {
  Study s;
  REQUIRE(RunCli({"--study", s.path, "plan"}).exit_code == 0);
  for (const char* probe : {"P00001", "P00002", "P00003"})
    REQUIRE(RunCli({"--study", s.path, "sent", probe, "--at", "2027-03-01"}).exit_code == 0);
  auto r = RunCli({"--study", s.path, "record", "P00001", "invitation", "--at", "2027-03-04T10:00"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("Decline the invitation to P00001 by 2027-03-05T10:00:00Z (within 24 hours of receipt) with the "
                   "letter in " + s.path + "/ethics/letters/decline-invitation.md, then run 'twinprobe --study " +
                   s.path + " decline P00001'.") != std::string::npos);
  auto j = nlohmann::json::parse(
      RunCli({"--study", s.path, "--json", "record", "P00002", "offer", "--at", "2027-03-06T08:00"}).out);
  CHECK(j["decline_by"] == "2027-03-07T08:00:00Z");
  auto rejection = RunCli({"--study", s.path, "record", "P00003", "rejection", "--at", "2027-03-06"});
  CHECK(rejection.out.find("Decline it") == std::string::npos);
  auto nothing = RunCli({"--study", s.path, "decline", "P00003"});
  CHECK(nothing.exit_code == 1);
  CHECK(nothing.err == "twinprobe: the current response to P00003 is 'rejection' (received 2027-03-06T00:00:00Z), "
                       "which needs no decline \u2014 only a positive response (info_request, invitation, offer) is "
                       "declined; if the employer answered again, record that first with 'twinprobe record'\n");
  auto ok = RunCli({"--study", s.path, "decline", "P00001", "--at", "2027-03-04T15:00"});
  CHECK(ok.exit_code == 0);
  CHECK(ok.out == "Recorded that the invitation to P00001 was declined at 2027-03-04T15:00:00Z.\n"
                  "The deadline was to decline the invitation to P00001 by 2027-03-05T10:00:00Z (within 24 hours of "
                  "receipt): kept.\n" +
                     testing::HeadLine(s.path));
}

TEST_CASE("ethics: schedule lists overdue declines first, then those still due, then what to send") {
  Study s;
  REQUIRE(RunCli({"--study", s.path, "plan"}).exit_code == 0);
  for (const char* probe : {"P00001", "P00002", "P00003"})
    REQUIRE(RunCli({"--study", s.path, "sent", probe, "--at", "2027-03-01"}).exit_code == 0);
  REQUIRE(RunCli({"--study", s.path, "record", "P00002", "offer", "--at", "2027-03-06T08:00"}).exit_code == 0);
  REQUIRE(RunCli({"--study", s.path, "record", "P00001", "invitation", "--at", "2027-03-04T10:00"}).exit_code == 0);
  REQUIRE(RunCli({"--study", s.path, "record", "P00003", "rejection", "--at", "2027-03-04T10:00"}).exit_code == 0);
  const std::vector<std::string> now = {"TWINPROBE_NOW=2027-03-06T12:00:00Z"};

  auto text = RunCli({"--study", s.path, "schedule"}, now);
  REQUIRE(text.exit_code == 0);
  auto overdue = text.out.find("OVERDUE: 1 positive response not declined within 24 hours of receipt.");
  auto p1 = text.out.find("  overdue: decline the invitation to P00001 by 2027-03-05T10:00:00Z");
  auto still = text.out.find("Still within the deadline:");
  auto p2 = text.out.find("  due: decline the offer to P00002 by 2027-03-07T08:00:00Z");
  auto to_send = text.out.find("probes to send");
  CHECK(overdue == 0);  // the very first line
  CHECK(p1 != std::string::npos);
  CHECK(still != std::string::npos);
  CHECK(p2 != std::string::npos);
  CHECK(to_send != std::string::npos);
  CHECK((overdue < p1 && p1 < still && still < p2 && p2 < to_send));
  std::string declines_block = text.out.substr(0, to_send);
  CHECK(declines_block.find("P00003") == std::string::npos);  // a rejection needs no decline

  auto j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "schedule"}, now).out);
  REQUIRE(j["declines"].size() == 2);
  CHECK(j["declines"][0]["probe"] == "P00001");
  CHECK(j["declines"][0]["overdue"] == true);
  CHECK(j["declines"][0]["decline_by"] == "2027-03-05T10:00:00Z");
  CHECK(j["declines"][1]["probe"] == "P00002");
  CHECK(j["declines"][1]["overdue"] == false);

  REQUIRE(RunCli({"--study", s.path, "decline", "P00001", "--at", "2027-03-06T11:30"}, now).exit_code == 0);
  auto after = RunCli({"--study", s.path, "schedule"}, now);
  CHECK(after.out.find("OVERDUE") == std::string::npos);
  CHECK(after.out.rfind("1 positive response to decline", 0) == 0);
  CHECK(after.out.substr(0, after.out.find("probes to send")).find("P00001") == std::string::npos);
}

TEST_CASE("ethics: purge waits for the retention period, then removes identities and keeps the analysis") {
  testing::TempDir dir;
  std::string demo = dir / "demo";
  REQUIRE(RunCli({"demo", "--out", demo}).exit_code == 0);
  REQUIRE(RunCli({"--study", demo, "record", "P00001", "invitation", "--at", "2027-06-01", "--note",
                  "Ms Invented of HR called"},
                 {"TWINPROBE_NOW=2027-06-01T12:00:00Z"})
              .exit_code == 0);
  testing::WriteFile(demo + "/materials/P00001.txt", "rendered application");
  auto analysis_before = RunCli({"--study", demo, "--json", "analyze"}).out;
  auto entries_before = nlohmann::json::parse(RunCli({"--study", demo, "--json", "verify"}).out)["entries"].get<int>();

  auto early = RunCli({"--study", demo, "purge"}, {"TWINPROBE_NOW=2028-05-01"});
  CHECK(early.exit_code == 1);
  CHECK(early.err.find("the retention period has not ended") != std::string::npos);

  auto dry = nlohmann::json::parse(RunCli({"--study", demo, "--json", "purge", "--dry-run"}).out);
  CHECK(dry["employers"] == 400);
  CHECK(dry["notes"] == 1);
  CHECK(dry["material_files"] == 1);
  CHECK(dry["fieldwork_end"] == "2027-06-01T00:00:00Z");
  CHECK(dry["retention_ends"] == "2028-05-31T00:00:00Z");

  auto done = RunCli({"--study", demo, "purge"}, {"TWINPROBE_NOW=2028-06-01"});
  INFO(done.err);
  REQUIRE(done.exit_code == 0);
  CHECK(done.out.rfind("Purged: 400 employer identities, 1 free-text note, ", 0) == 0);
  auto store = Store::Open(demo + "/study.db", false);
  REQUIRE(store.ok());
  CHECK(store.value()->QueryInt("SELECT count(*) FROM employer") == 0);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM secret") == 0);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM response WHERE note IS NOT NULL") == 0);
  CHECK_FALSE(std::filesystem::exists(demo + "/materials"));
  CHECK(RunCli({"--study", demo, "--json", "analyze"}).out == analysis_before);
  auto verify = RunCli({"--study", demo, "verify"});
  CHECK(verify.exit_code == 0);
  auto audit = nlohmann::json::parse(RunCli({"--study", demo, "--json", "verify"}).out);
  CHECK(audit["entries"] == entries_before + 1);  // the purge itself is recorded
}
