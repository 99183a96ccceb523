// End-to-end tests of sent, record, import outcomes and import pairs
// (cli/collect_cmds.cpp) through the real binary on real study folders.
#include <catch2/catch.hpp>

#include <filesystem>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

TEST_CASE("cli record: a late response is stored with a warning that says by how much") {
  testing::PlannedStudy s;
  REQUIRE(RunCli({"--study", s.path, "sent", "P00001", "--at", "2027-03-01T09:00"}).exit_code == 0);
  auto r = RunCli({"--study", s.path, "record", "P00001", "rejection", "--at", "2027-04-15"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Recorded rejection for P00001 at 2027-04-15T00:00:00Z.\n" + testing::HeadLine(s.path));
  CHECK(r.err == "twinprobe: warning: the response came 45 days after P00001 was sent, outside the observation window "
                 "of 28 days; it is stored with the flag 'late'\n");
  auto j = RunCli({"--study", s.path, "--json", "record", "P00001", "rejection", "--at", "2027-04-16"});
  auto doc = nlohmann::json::parse(j.out);
  CHECK(doc["late"] == true);
  CHECK(doc["sent_at"] == "2027-03-01T09:00:00Z");
  CHECK(doc["supersedes"] == 1);
}

TEST_CASE("issue 17: cli record refuses a probe never marked sent, bad times and channels too") {
  testing::PlannedStudy s;
  const std::string before = testing::HeadLine(s.path);
  auto r = RunCli({"--study", s.path, "--json", "record", "P00002", "rejection", "--at", "2027-03-05", "--channel",
                   "letter"});
  CHECK(r.exit_code == 1);
  CHECK(r.out.empty());
  CHECK(r.err == "twinprobe: P00002 has no sending recorded, so no response to it can have come \u2014 record the "
                 "sending first with 'twinprobe sent P00002 --at TIME' (or 'twinprobe import sendings FILE.csv' for "
                 "many)\n");
  CHECK(testing::HeadLine(s.path) == before);
  testing::SendProbes(s.path, {"P00002"}, "2027-03-01");
  auto bad = RunCli({"--study", s.path, "record", "P00002", "rejection", "--at", "yesterday"});
  CHECK(bad.exit_code == 1);
  CHECK(bad.err == "twinprobe: 'yesterday' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)\n");
  auto channel = RunCli({"--study", s.path, "record", "P00002", "rejection", "--channel", "email"});
  CHECK(channel.exit_code == 1);
  CHECK(channel.err == "twinprobe: unknown channel 'email' (did you mean 'mail'?) \u2014 use mail, phone, letter or other\n");
}

TEST_CASE("cli sent: a second sending time replaces the first, which is kept") {
  testing::PlannedStudy s;
  REQUIRE(RunCli({"--study", s.path, "sent", "P00003", "--at", "2027-03-01"}).exit_code == 0);
  auto r = RunCli({"--study", s.path, "sent", "P00003", "--at", "2027-03-02T08:30"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Marked P00003 as sent at 2027-03-02T08:30:00Z; this replaces the earlier sending time "
                 "2027-03-01T00:00:00Z, which is kept.\n" +
                     testing::HeadLine(s.path));
}

TEST_CASE("cli import outcomes: summary, reject file and exit code 1 with --skip-bad") {
  testing::PlannedStudy s;
  std::string csv = s.dir / "in.csv";
  testing::SendProbes(s.path, {"P00001"}, "2027-03-01");
  testing::WriteFile(csv, "probe,code,received_at,source\nP00001,invitation,2027-03-05,x\nP0002,offer,2027-03-06,y\n");
  auto r = RunCli({"--study", s.path, "import", "outcomes", csv, "--skip-bad"});
  CHECK(r.exit_code == 1);
  CHECK(r.out == "Imported 1 response from " + csv + "; 1 bad row was written with the reasons to " + csv +
                     ".rejects.csv.\n" + testing::HeadLine(s.path));
  CHECK(r.err == "twinprobe: warning: the column 'source' is not part of an outcomes file and was ignored\n");
  auto again = RunCli({"--study", s.path, "import", "outcomes", csv, "--skip-bad"});
  CHECK(again.exit_code == 0);
  CHECK(again.out == "This file was imported before; nothing was added.\n");
}

TEST_CASE("cli import pairs: a folder without a design, then analyze and report run on it") {
  testing::TempDir dir;
  std::string study = dir / "newsroom";
  std::string csv = dir / "applications.csv";
  std::string text = "vacancy,arm,outcome,sent_at,responded_at,sector\n";
  // 30 pairs, invented: the reference arm is called back in 12, the other in 6.
  for (int v = 1; v <= 30; ++v) {
    std::string sector = v % 2 ? "retail" : "logistics";
    text += "V" + std::to_string(v) + ",majority," + (v <= 12 ? "1" : "0") + ",2027-05-0" + std::to_string(1 + v % 9) +
            ",," + sector + "\n";
    text += "V" + std::to_string(v) + ",minority," + (v % 5 == 0 ? "1" : "0") + ",2027-05-0" + std::to_string(1 + v % 9) +
            ",," + sector + "\n";
  }
  testing::WriteFile(csv, text);
  auto r = RunCli({"--study", study, "import", "pairs", csv, "--reference", "majority", "--strata", "sector"});
  INFO(r.err);
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Created a paired study from " + csv + ": 60 probes in 30 vacancies; reference arm majority, "
                     "compared with minority; strata sector.\nNext: twinprobe --study " + study + " analyze\n" +
                     testing::HeadLine(study));
  CHECK(r.err.find('\r') == std::string::npos);  // no progress bar when stderr is not a terminal
  CHECK_FALSE(std::filesystem::exists(study + "/study.toml"));

  auto analysis = RunCli({"--study", study, "--json", "analyze"});
  INFO(analysis.err);
  REQUIRE(analysis.exit_code == 0);
  auto a = nlohmann::json::parse(analysis.out);
  CHECK(a["counts"]["vacancies"] == 30);
  CHECK(a["counts"]["sets_analysed"] == 30);
  CHECK(a["paired"]["table"]["n"] == 30);
  // V1..V12 majority positive; minority positive at V5, V10 (both arms), V15, V20, V25, V30.
  CHECK(a["paired"]["table"]["a"] == 2);
  CHECK(a["paired"]["table"]["b"] == 10);
  CHECK(a["paired"]["table"]["c"] == 4);
  CHECK(a["paired"]["table"]["d"] == 14);
  auto report = RunCli({"--study", study, "report", "--out", dir / "report.txt"});
  CHECK(report.exit_code == 0);
  CHECK(testing::ReadFile(dir / "report.txt").find("majority") != std::string::npos);

  auto json = nlohmann::json::parse(RunCli({"--study", study, "--json", "import", "pairs", csv}).out);
  CHECK(json["already_imported"] == true);
  CHECK(RunCli({"--study", study, "verify"}).exit_code == 0);
}

TEST_CASE("cli import pairs: a failed import leaves no store and says where") {
  testing::TempDir dir;
  std::string csv = dir / "p.csv";
  testing::WriteFile(csv, "vacancy,arm,outcome\nV1,a,1\nV1,b,2\n");
  auto r = RunCli({"--study", dir / "s", "import", "pairs", csv, "--reference", "a"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + csv + ":3: outcome '2' is not 1, 0 or a response code \u2014 use 1 or 0 (a positive "
                                       "callback or not), or one of: none, rejection, info_request, invitation, offer\n");
  CHECK_FALSE(std::filesystem::exists(dir / "s/study.db"));
}

TEST_CASE("cli import pairs: a progress bar on a terminal", "[pty]") {
  // `script` runs the import on a pseudo-terminal, so stderr is a TTY there.
  testing::TempDir dir;
  std::string csv = dir / "big.csv";
  std::string text = "vacancy,arm,outcome,occupation\n";
  for (int v = 0; v < 30000; ++v)
    text += "V" + std::to_string(v) + ",a,1,clerk\nV" + std::to_string(v) + ",b,0,clerk\n";
  testing::WriteFile(csv, text);
  // The delay before a bar first draws is set to 0 so the test does not
  // depend on how fast this machine checks 60,000 rows.
  std::string command = "TWINPROBE_PROGRESS_DELAY_MS=0 '" + testing::BinaryPath() + "' --study '" + dir / "s" + "' import pairs '" + csv +
                        "' --reference a --strata occupation";
  std::string out = dir / "tty.txt";
  int rc = std::system(("script -qec \"" + command + "\" /dev/null > '" + out + "' 2>&1").c_str());
  CHECK(rc == 0);
  std::string tty = testing::ReadFile(out);
  CHECK(tty.find("\rimporting " + csv + " [") != std::string::npos);
  CHECK(tty.find("\rchecking " + csv + " [") != std::string::npos);
  CHECK(tty.find("] 100%") != std::string::npos);
  CHECK(tty.find("Created a paired study") != std::string::npos);
}

TEST_CASE("cli: help lists history and export") {
  auto help = RunCli({"--help"});
  CHECK(help.out.find("history") != std::string::npos);
  CHECK(help.out.find("export") != std::string::npos);
  auto import_help = RunCli({"import", "--help"});
  CHECK(import_help.out.find("pairs") != std::string::npos);
}
