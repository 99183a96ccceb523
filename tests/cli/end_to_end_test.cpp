// End-to-end tests of the real binary on real study folders.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "core/audit.h"
#include "core/store.h"
#include "testing/pinned_clock.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

TEST_CASE("demo: runs end to end, writes reports and finds the built-in effect") {
  testing::TempDir dir;
  auto r = RunCli({"demo", "--out", dir / "demo"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("Exact McNemar test") != std::string::npos);
  auto json = nlohmann::json::parse(testing::ReadFile(dir / "demo/reports/report.json"));
  CHECK(json["counts"]["vacancies"] == 400);
  CHECK(json["counts"]["probes_planned"] == 800);
  CHECK(json["counts"]["sets_analysed"] == 400);
  // The model favours the reference arm (true discordant share 0.674), so b > c.
  CHECK(json["paired"]["table"]["b"].get<int>() > json["paired"]["table"]["c"].get<int>());
  CHECK(json["paired"]["table"]["n"] == 400);
  auto verify = RunCli({"--study", dir / "demo", "verify"});
  CHECK(verify.exit_code == 0);
  CHECK(verify.out.rfind("The audit chain is intact", 0) == 0);
  // The report shows the plan's balance: arm x template, send order, each stratum, weekday.
  CHECK(r.out.find("Balance of the plan") != std::string::npos);
  std::vector<std::string> variables;
  for (const auto& t : json["balance"]["tables"]) variables.push_back(t["variable"]);
  CHECK(variables == std::vector<std::string>{"template", "send_order", "stratum:occupation", "stratum:region", "weekday"});
  CHECK(json["balance"]["tables"][0]["max_spread"] == 0);
}

TEST_CASE("demo: the same seed gives the same numbers twice") {
  testing::TempDir dir;
  REQUIRE(RunCli({"demo", "--out", dir / "a"}).exit_code == 0);
  REQUIRE(RunCli({"demo", "--out", dir / "b"}).exit_code == 0);
  // Everything but the wall-clock time of the demo's freeze repeats exactly.
  auto a = nlohmann::json::parse(testing::ReadFile(dir / "a/reports/report.json"));
  auto b = nlohmann::json::parse(testing::ReadFile(dir / "b/reports/report.json"));
  CHECK(a["preregistration"]["frozen"] == true);
  CHECK(a["preregistration"]["deviations"].empty());
  a["preregistration"].erase("frozen_at");
  b["preregistration"].erase("frozen_at");
  CHECK(a == b);
}

TEST_CASE("demo: refuses to overwrite a folder that is not an earlier demo") {
  testing::TempDir dir;
  testing::WriteFile(dir / "mine/notes.txt", "precious");
  auto r = RunCli({"demo", "--out", dir / "mine"});
  CHECK(r.exit_code == 1);
  CHECK(testing::ReadFile(dir / "mine/notes.txt") == "precious");
}

namespace {

// An initialised and planned study in a temp folder.
struct PlannedStudy {
  testing::PinnedClock clock;  // the season's end: fieldwork times may not lie in the future
  testing::TempDir dir;
  std::string study;
  PlannedStudy() : study(dir / "s") {
    REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
    auto plan = RunCli({"--study", study, "plan"});
    INFO(plan.err);
    REQUIRE(plan.exit_code == 0);
  }
};

}  // namespace

TEST_CASE("cli: a bad study.toml gives one error line with its position and exit 1") {
  PlannedStudy s;
  std::string toml = testing::ReadFile(s.study + "/study.toml");
  toml.replace(toml.find("kind = \"paired\""), 15, "kind = \"pared\"");
  testing::WriteFile(s.study + "/study.toml", toml);
  auto r = RunCli({"--study", s.study, "check"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + s.study + "/study.toml:10:8: [study].kind must be paired, sets, unpaired or listing, got "
                 "'pared' (did you mean 'paired'?) \u2014 pick one of the four\n");
}

TEST_CASE("cli: an unknown probe gives one error line and exit 1, and the store is unchanged") {
  PlannedStudy s;
  auto before = RunCli({"--study", s.study, "--json", "verify"});
  auto r = RunCli({"--study", s.study, "record", "P99999", "invitation"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: unknown probe 'P99999' \u2014 use a probe reference from 'twinprobe schedule' or the plan "
                 "(e.g. P00001)\n");
  CHECK(RunCli({"--study", s.study, "--json", "verify"}).out == before.out);
}

TEST_CASE("cli: a failed import rolls back: counts and audit head unchanged") {
  PlannedStudy s;
  testing::SendProbes(s.study, {"P00001", "P00002", "P00003"}, "2027-03-01");
  REQUIRE(RunCli({"--study", s.study, "record", "P00001", "invitation", "--at", "2027-03-05"}).exit_code == 0);
  auto head_before = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "verify"}).out)["head_hash"];
  testing::WriteFile(s.study + "/in.csv",
                     "probe,code,received_at\nP00002,invitation,2027-03-06\nP00003,invitaton,2027-03-06\n");
  auto r = RunCli({"--study", s.study, "import", "outcomes", s.study + "/in.csv"});
  CHECK(r.exit_code == 1);
  CHECK(r.err.find(s.study + "/in.csv:3: 'invitaton' is not a response code of this study (did you mean 'invitation'?)") !=
        std::string::npos);
  auto after = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "verify"}).out);
  CHECK(after["head_hash"] == head_before);
  auto store = Store::Open(s.study + "/study.db", false);
  REQUIRE(store.ok());
  CHECK(store.value()->QueryInt("SELECT count(*) FROM response") == 1);
}

TEST_CASE("cli: a bad vacancies CSV names file and line, exit 1") {
  testing::TempDir dir;
  std::string study = dir / "s";
  REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
  std::string csv = testing::ReadFile(study + "/vacancies.csv");
  csv += "V0001,Duplicate Works (invented),x@y.example,bookkeeper,Upland,2027-02-01\n";
  testing::WriteFile(study + "/vacancies.csv", csv);
  auto r = RunCli({"--study", study, "plan"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + study + "/vacancies.csv:402: vacancy 'V0001' appears twice (first on line 2) \u2014 "
                 "give each vacancy a unique reference\n");
}

TEST_CASE("cli: a corrected response supersedes the first, both kept, analysis uses the newest") {
  PlannedStudy s;
  REQUIRE(RunCli({"--study", s.study, "sent", "P00001", "--at", "2027-03-01T09:00"}).exit_code == 0);
  REQUIRE(RunCli({"--study", s.study, "record", "P00001", "rejection", "--at", "2027-03-04"}).exit_code == 0);
  auto fix = RunCli({"--study", s.study, "record", "P00001", "invitation", "--at", "2027-03-04"});
  REQUIRE(fix.exit_code == 0);
  CHECK(fix.out.find("supersedes response 1") != std::string::npos);
  auto early = RunCli({"--study", s.study, "record", "P00001", "invitation", "--at", "2027-02-20"});
  CHECK(early.exit_code == 1);
  CHECK(early.err.find("of P00001 is before its sending (2027-03-01T09:00:00Z)") != std::string::npos);
  auto store = Store::Open(s.study + "/study.db", false);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM response") == 2);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM current_response") == 1);
}

TEST_CASE("cli: help describes every command and a misspelt command gets a suggestion") {
  auto help = RunCli({"--help"});
  CHECK(help.exit_code == 0);
  for (const char* cmd : {"init", "check", "plan", "sent", "record", "import", "analyze", "report", "verify", "demo"})
    CHECK(help.out.find(cmd) != std::string::npos);
  auto typo = RunCli({"anlyze"});
  CHECK(typo.exit_code == 2);
  CHECK(typo.err == "twinprobe: unknown command 'anlyze' (did you mean 'analyze'?) \u2014 run 'twinprobe --help' for the list\n");
}
