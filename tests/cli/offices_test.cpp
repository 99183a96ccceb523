// Several field offices, one study (issue 22): a 300-vacancy study handed to
// three offices by region, fieldwork in each, merged back; the merged store
// analyses exactly like one store holding the same records; a tampered office
// store, a conflict and a kill -9 during a merge change nothing.
#include <catch2/catch.hpp>

#include <signal.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <thread>

#include <nlohmann/json.hpp>

#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

constexpr const char* kFieldNow = "TWINPROBE_NOW=2027-03-02T12:00:00Z";
constexpr const char* kAfterWindows = "TWINPROBE_NOW=2027-06-01T12:00:00Z";

testing::CliRun Run(const std::string& study, std::vector<std::string> args, const std::string& actor = "lead",
                    const std::string& now = kFieldNow) {
  args.insert(args.begin(), {"--study", study});
  return RunCli(args, {now, "TWINPROBE_ACTOR=" + actor});
}

void Ok(const std::string& study, const std::vector<std::string>& args, const std::string& actor = "lead") {
  auto r = Run(study, args, actor);
  INFO(study << " " << args.front() << ": " << r.err);
  REQUIRE(r.exit_code == 0);
}

// init's example study cut to its first 300 vacancies, planned.
void MakeStudy(const std::string& study) {
  Ok(study, {"init"});
  const std::string csv = testing::ReadFile(study + "/vacancies.csv");
  size_t end = 0;
  for (int line = 0; line < 301; ++line) end = csv.find('\n', end) + 1;
  testing::WriteFile(study + "/vacancies.csv", csv.substr(0, end));
  Ok(study, {"plan"});
}

std::vector<std::string> Probes(const std::string& study, int n) {
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  Stmt q = store.value()->Prepare("SELECT ref FROM current_probe ORDER BY id LIMIT ?1");
  q.Bind(1, n);
  std::vector<std::string> refs;
  while (q.Step()) refs.push_back(q.Text(0));
  return refs;
}

int64_t Count(const std::string& study, const std::string& sql) {
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  return store.value()->QueryInt(sql);
}

std::string CurrentCode(const std::string& study, const std::string& probe) {
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  Stmt q = store.value()->Prepare(
      "SELECT group_concat(r.code) FROM current_response r JOIN probe p ON p.id = r.probe_id WHERE p.ref = ?1");
  q.Bind(1, probe);
  q.Step();
  return q.Text(0);
}

// One office's season, done the same way in `where` (the office's folder or
// a single store holding everything): sendings, answers, a correction and a decline.
void Fieldwork(const std::string& where, const std::vector<std::string>& probes, const std::string& actor) {
  Ok(where, {"sent", probes[0], "--at", "2027-03-01T09:00"}, actor);
  Ok(where, {"sent", probes[1], "--at", "2027-03-01T10:00"}, actor);
  Ok(where, {"sent", probes[2], "--at", "2027-03-01T11:00"}, actor);
  Ok(where, {"sent", probes[3], "--at", "2027-03-01T12:00"}, actor);
  Ok(where, {"record", probes[0], "invitation", "--at", "2027-03-01T15:00"}, actor);
  Ok(where, {"record", probes[1], "rejection", "--at", "2027-03-01T15:30"}, actor);
  Ok(where, {"record", probes[2], "rejection", "--at", "2027-03-01T16:00"}, actor);
  Ok(where, {"record", probes[2], "info_request", "--at", "2027-03-01T16:00"}, actor);  // a correction
  Ok(where, {"decline", probes[0], "--at", "2027-03-01T18:00"}, actor);
}

struct Offices {
  testing::TempDir dir;
  std::string main = dir / "main";
  std::vector<std::string> regions = {"North Fen", "Upland", "Harbour Coast"};
  std::vector<std::string> names = {"north-fen", "upland", "harbour"};
  std::string single = dir / "single";  // the study as planned, before any handout
  std::vector<std::string> folders;
  Offices() {
    MakeStudy(main);
    std::filesystem::copy(main, single, std::filesystem::copy_options::recursive);
    for (size_t i = 0; i < names.size(); ++i) {
      folders.push_back(dir / names[i]);
      Ok(main, {"handout", "--to", folders[i], "--stratum", "region=" + regions[i]});
    }
  }
};

}  // namespace

TEST_CASE("offices: three offices worked and merged analyse like one store holding the same records") {
  Offices o;
  const std::string& single = o.single;
  for (size_t i = 0; i < o.folders.size(); ++i) {
    const auto probes = Probes(o.folders[i], 4);
    Fieldwork(o.folders[i], probes, o.names[i] + "-clerk");
    Fieldwork(single, probes, o.names[i] + "-clerk");
    CHECK(Run(o.folders[i], {"history", probes[2]}).out.find("response 3: rejection") != std::string::npos);
    auto verified = Run(o.folders[i], {"verify"});
    INFO(verified.out << verified.err);
    CHECK(verified.exit_code == 0);
  }
  auto merged = Run(o.main, {"merge", o.folders[0], o.folders[1], o.folders[2]});
  INFO(merged.err);
  REQUIRE(merged.exit_code == 0);
  std::string expected;
  for (size_t i = 0; i < o.names.size(); ++i)
    expected += "Office " + o.names[i] + ": merged up to its entry 10 (head " +
                testing::HeadLine(o.folders[i]).substr(12, 64) +
                "):\n  4 sendings, 4 responses, 1 decline, 0 mail messages, 0 review decisions.\n";
  CHECK(merged.out == expected + testing::HeadLine(o.main));

  // The merged store and the single store: the same analysis.
  auto a = RunCli({"--json", "--study", o.main, "analyze"}, {kAfterWindows});
  auto b = RunCli({"--json", "--study", single, "analyze"}, {kAfterWindows});
  REQUIRE(a.exit_code == 0);
  REQUIRE(b.exit_code == 0);
  auto ja = nlohmann::json::parse(a.out), jb = nlohmann::json::parse(b.out);
  CHECK(ja["flow"]["sets_analysed"] == 6);
  CHECK(ja.dump(1) == jb.dump(1));


  // The original people and times travel; the merge entry is the merger's.
  CHECK(Count(o.main, "SELECT count(*) FROM response WHERE entered_by = 'upland-clerk'") == 4);
  CHECK(Count(o.main, "SELECT count(*) FROM sending WHERE entered_by = 'harbour-clerk' AND sent_at = "
                     "'2027-03-01T12:00:00Z'") == 1);
  auto verified = Run(o.main, {"verify"});
  INFO(verified.out);
  CHECK(verified.exit_code == 0);
  auto store = Store::Open(o.main + "/study.db", false);
  Stmt summary = store.value()->Prepare("SELECT summary FROM audit WHERE command = 'merge' ORDER BY seq LIMIT 1 OFFSET 1");
  REQUIRE(summary.Step());
  CHECK(summary.Text(0) == ("merge office upland up to its entry 10 (head " +
                         testing::HeadLine(o.folders[1]).substr(12, 16) +
                         "): sendings 4, responses 4, declines 1, mail messages 0, review decisions 0, "
                         "conflict choices 0"));
  CHECK(Run(o.main, {"history", Probes(o.folders[1], 1)[0]}).out.find("upland-clerk") != std::string::npos);

  // Merging the same state again adds nothing; a later merge only what is new.
  const std::string head = testing::HeadLine(o.main);
  auto again = Run(o.main, {"merge", o.folders[1]});
  CHECK(again.exit_code == 0);
  CHECK(again.out == "Office upland: nothing new (its head, entry 10, was merged before).\n");
  CHECK(testing::HeadLine(o.main) == head);
  const auto upland = Probes(o.folders[1], 5);
  Ok(o.folders[1], {"sent", upland[4], "--at", "2027-03-02T09:00"}, "upland-clerk");
  auto later = Run(o.main, {"merge", o.folders[1]});
  CHECK(later.out == "Office upland: merged up to its entry 11 (head " + testing::HeadLine(o.folders[1]).substr(12, 64) +
                         "):\n  1 sending, 0 responses, 0 declines, 0 mail messages, 0 review decisions.\n" +
                         testing::HeadLine(o.main));
  CHECK(Count(o.main, "SELECT count(*) FROM sending") == 13);

  auto status = Run(o.main, {"status"});
  CHECK(status.out ==
        "Offices (sent and closed as merged into this store):\n"
        "  office               vacancies  probes   sent  closed  merged\n"
        "  north-fen                  100     200      4       3  1 time, last up to its entry 10 at 2027-03-02T12:00:00Z\n"
        "  upland                     100     200      5       3  2 times, last up to its entry 11 at 2027-03-02T12:00:00Z\n"
        "  harbour                    100     200      4       3  1 time, last up to its entry 10 at 2027-03-02T12:00:00Z\n"
        "0 vacancies are not handed out (the main store's own).\n");
}

TEST_CASE("offices: a vacancy is handed out once, and the second office is told which office has it") {
  Offices o;
  testing::TempDir lists;
  testing::WriteFile(lists / "extra.txt", "# vacancies for an outside agency\nV0001\n");
  auto r = Run(o.main, {"handout", "--to", lists / "agency", "--vacancies", lists / "extra.txt"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + (lists / "extra.txt") +
                     ": these vacancies were handed out already, to office north-fen: V0001 — a vacancy is handed "
                     "out once: leave them out of this office's list\n");
  testing::WriteFile(lists / "bad.txt", "V0001\n  V9999\n");
  r = Run(o.main, {"handout", "--to", lists / "agency", "--vacancies", lists / "bad.txt"});
  CHECK(r.err == "twinprobe: " + (lists / "bad.txt") +
                     ":2:3: 'V9999' is not a vacancy of the current plan — write one vacancy reference a line, as in "
                     "the vacancies file's 'vacancy' column (e.g. V0001)\n");
  CHECK_FALSE(std::filesystem::exists(lists / "agency"));
}

TEST_CASE("offices: an office store changed behind the chain is refused, naming the entry") {
  Offices o;
  const auto probes = Probes(o.folders[0], 4);
  Fieldwork(o.folders[0], probes, "nina");
  {
    auto store = Store::Open(o.folders[0] + "/study.db", false);
    store.value()->Exec("UPDATE response SET code = 'offer' WHERE id = (SELECT min(id) FROM response)");
  }
  const std::string head = testing::HeadLine(o.main);
  auto r = Run(o.main, {"merge", o.folders[0]});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + o.folders[0] +
                     "/study.db: the office's audit chain is broken at entry 6: rows written by this entry (record) "
                     "were changed, added or deleted since (tables now holding them: response) — nothing was merged; "
                     "get an intact copy of the office's store (its backup) and check it with 'twinprobe --study " +
                     o.folders[0] + " verify'\n");
  CHECK(testing::HeadLine(o.main) == head);
  CHECK(Count(o.main, "SELECT count(*) FROM response") == 0);
}

TEST_CASE("offices: different answers in two places stop the merge until --prefer decides, and the choice is sealed") {
  Offices o;
  const auto probes = Probes(o.folders[0], 1);
  Ok(o.folders[0], {"sent", probes[0], "--at", "2027-03-01T09:00"}, "nina");
  Ok(o.folders[0], {"record", probes[0], "rejection", "--at", "2027-03-01T15:00"}, "nina");
  Ok(o.main, {"sent", probes[0], "--at", "2027-03-01T09:00"}, "lead");
  Ok(o.main, {"record", probes[0], "invitation", "--at", "2027-03-01T14:00"}, "lead");
  const std::string head = testing::HeadLine(o.main);
  auto stopped = Run(o.main, {"merge", o.folders[0]});
  CHECK(stopped.exit_code == 1);
  CHECK(stopped.out ==
        "Conflicts (different current responses in two places):\n"
        "  " + probes[0] + ": main has invitation, office north-fen has rejection\n"
        "    main:\n"
        "      response 1     invitation, received 2027-03-01T14:00:00Z, entered by lead at 2027-03-02T12:00:00Z — current\n"
        "    north-fen:\n"
        "      response 1     rejection, received 2027-03-01T15:00:00Z, entered by nina at 2027-03-02T12:00:00Z — current\n");
  CHECK(stopped.err ==
        "twinprobe: merge: 1 probe has different current responses in the main store and an office (listed above); "
        "nothing was merged — decide which to keep: merge again with --prefer main or --prefer north-fen (the choice "
        "is sealed in the chain)\n");
  CHECK(testing::HeadLine(o.main) == head);

  auto unknown = Run(o.main, {"merge", o.folders[0], "--prefer", "upland"});
  CHECK(unknown.exit_code == 2);
  CHECK(unknown.err == "twinprobe: --prefer: 'upland' is neither 'main' nor an office being merged — use one of: main, "
                       "north-fen\n");

  auto kept = Run(o.main, {"--json", "merge", o.folders[0], "--prefer", "main"});
  INFO(kept.err);
  REQUIRE(kept.exit_code == 0);
  auto j = nlohmann::json::parse(kept.out);
  CHECK(j["merged"] == true);
  CHECK(j["offices"][0]["office"] == "north-fen");
  CHECK(j["offices"][0]["choices"] == 1);
  CHECK(j["offices"][0]["resolved"][0]["probe"] == probes[0]);
  CHECK(j["offices"][0]["resolved"][0]["main"][0]["code"] == "invitation");
  CHECK(j["offices"][0]["resolved"][0]["office_history"][0]["entered_by"] == "nina");
  CHECK(j["audit_head"] == testing::HeadLine(o.main).substr(12, 64));
  CHECK(CurrentCode(o.main, probes[0]) == "invitation");
  CHECK(Count(o.main, "SELECT count(*) FROM response") == 3);  // main's, the office's, main's restated
  CHECK(Count(o.main, "SELECT count(*) FROM merge_choice WHERE prefer = 'main'") == 1);
  CHECK(Run(o.main, {"verify"}).exit_code == 0);

  // The office corrects its answer later: a conflict again, this time the office wins.
  Ok(o.folders[0], {"record", probes[0], "offer", "--at", "2027-03-01T15:00"}, "nina");
  CHECK(Run(o.main, {"merge", o.folders[0]}).exit_code == 1);
  auto office_wins = Run(o.main, {"merge", o.folders[0], "--prefer", "north-fen"});
  REQUIRE(office_wins.exit_code == 0);
  CHECK(CurrentCode(o.main, probes[0]) == "offer");
  CHECK(Count(o.main, "SELECT count(*) FROM merge_choice WHERE prefer = 'office'") == 1);
  CHECK(Run(o.main, {"verify"}).exit_code == 0);
}

TEST_CASE("offices: kill -9 during a merge leaves all or nothing") {
  Offices o;
  const auto probes = Probes(o.folders[2], 4);
  Fieldwork(o.folders[2], probes, "ivo");
  const std::string head = testing::HeadLine(o.main);
  const std::string marker = o.dir / "paused";
  int pid = testing::SpawnCli({"--study", o.main, "merge", o.folders[2]},
                              {kFieldNow, "TWINPROBE_TEST_MERGE_PAUSE=" + marker});
  for (int i = 0; i < 600 && !std::filesystem::exists(marker); ++i)
    std::this_thread::sleep_for(std::chrono::milliseconds(50));
  REQUIRE(std::filesystem::exists(marker));  // every row written, not committed
  kill(pid, SIGKILL);
  CHECK(testing::WaitCli(pid) == -SIGKILL);
  CHECK(testing::HeadLine(o.main) == head);
  CHECK(Count(o.main, "SELECT count(*) FROM response") == 0);
  CHECK(Count(o.main, "SELECT count(*) FROM merged_row") == 0);
  CHECK(Run(o.main, {"verify"}).exit_code == 0);
  auto again = Run(o.main, {"merge", o.folders[2]});
  CHECK(again.exit_code == 0);
  CHECK(Count(o.main, "SELECT count(*) FROM response") == 4);
}
