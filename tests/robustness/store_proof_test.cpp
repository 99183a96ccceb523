// Issue 23: the store proves what it holds. Each case changes a real study
// behind the tool's back the way the adversarial run did, then runs the real
// `twinprobe verify`.
#include <catch2/catch.hpp>

#include <sys/stat.h>

#include <atomic>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <thread>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"
#include "core/sha256.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

const std::vector<std::string> kEnv = {"TWINPROBE_ACTOR=ana", "TWINPROBE_NOW=2027-03-06T08:00"};

// A planned study whose probes P00001 to P0000n are sent on 2027-03-01, one
// `sent` each (a response needs a sending): audit entries 2 to n + 1, so the
// first `record` is entry n + 2.
struct Study {
  testing::PlannedStudy s;
  explicit Study(int sent = 3) {
    std::vector<std::string> probes;
    char ref[16];
    for (int i = 1; i <= sent; ++i) std::snprintf(ref, sizeof ref, "P%05d", i), probes.emplace_back(ref);
    testing::SendProbes(s.path, probes, "2027-03-01", kEnv);
  }
  testing::CliRun Record(const std::string& probe, const std::string& code) {
    auto r = RunCli({"--study", s.path, "record", probe, code, "--at", "2027-03-05"}, kEnv);
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
    return r;
  }
  void Sql(const std::string& sql) { s.Open()->Exec(sql); }
  testing::CliRun Verify(std::vector<std::string> extra = {}) {
    std::vector<std::string> args = {"--study", s.path, "verify"};
    args.insert(args.end(), extra.begin(), extra.end());
    return RunCli(args);
  }
  nlohmann::json VerifyJson(std::vector<std::string> extra = {}) {
    std::vector<std::string> args = {"--study", s.path, "--json", "verify"};
    args.insert(args.end(), extra.begin(), extra.end());
    return nlohmann::json::parse(RunCli(args).out);
  }
};

bool HasProblem(const nlohmann::json& j, int64_t seq, const std::string& what) {
  for (const auto& p : j["problems"])
    if (p["seq"] == seq && p["what"] == what) return true;
  return false;
}

std::string FileDigest(const std::string& path) { return Sha256Hex(testing::ReadFile(path)); }

}  // namespace

TEST_CASE("issue 23: a trigger that turns a recorded invitation into a rejection is caught") {
  Study st;
  st.Record("P00001", "rejection");
  st.Sql("CREATE TRIGGER flip AFTER INSERT ON response BEGIN "
         "UPDATE response SET code = 'rejection' WHERE id = new.id; END");
  st.Record("P00002", "invitation");  // entry 6; the trigger rewrites it before it is sealed
  auto text = st.Verify();
  CHECK(text.exit_code == 1);
  CHECK(text.out ==
        "The audit chain is BROKEN. First broken link: the store: the store holds a trigger 'flip' on response that "
        "twinprobe does not create.\n"
        "  also entry 6: its summary says 'record P00002 invitation' but the rows it sealed say 'record P00002 "
        "rejection'\n");
  auto j = st.VerifyJson();
  CHECK(j["ok"] == false);
  CHECK(j["problems"][1]["actor"] == "ana");
  CHECK(j["problems"][1]["command"] == "record");
}

TEST_CASE("issue 23: a redefined current_response or current_probe view is caught") {
  Study st;
  st.Record("P00001", "invitation");
  const std::string view = GENERATE(std::string("current_response"), std::string("current_probe"));
  INFO(view);
  st.Sql("DROP VIEW " + view + "; CREATE VIEW " + view + " AS SELECT * FROM " +
         (view == "current_response" ? "response WHERE code <> 'invitation'" : "probe WHERE id % 2 = 0"));
  auto text = st.Verify();
  CHECK(text.exit_code == 1);
  CHECK(text.out == "The audit chain is BROKEN. First broken link: the store: the view '" + view +
                        "' differs from the one twinprobe creates (its SQL was changed, e.g. a column renamed or the "
                        "view redefined).\n");
}

TEST_CASE("issue 23: a renamed column is caught") {
  Study st;
  st.Record("P00001", "invitation");
  st.Sql("ALTER TABLE response RENAME COLUMN channel TO medium");
  auto j = st.VerifyJson();
  CHECK(j["ok"] == false);
  CHECK(HasProblem(j, 0,
                   "the table 'response' differs from the one twinprobe creates (its SQL was changed, e.g. a column "
                   "renamed or the table redefined)"));
}

TEST_CASE("issue 23: a dropped index and an added table are caught") {
  Study st;
  st.Sql("DROP INDEX response_supersedes; CREATE TABLE scratch(x)");
  auto j = st.VerifyJson();
  CHECK(HasProblem(j, 0, "the store holds a table 'scratch' that twinprobe does not create"));
  CHECK(HasProblem(j, 0, "the index 'response_supersedes' that twinprobe creates is missing"));
}

TEST_CASE("issue 23: a zero-byte study.db is refused and stays zero bytes") {
  testing::TempDir dir;
  testing::WriteFile(dir / "study.db", "");
  auto r = RunCli({"--study", dir.path(), "verify"});
  CHECK(r.exit_code == 1);
  CHECK(r.out.empty());
  CHECK(r.err == "twinprobe: " + dir / "study.db" +
                     ": is not a study store (the file is empty) \u2014 pass --study with the study folder; a study "
                     "store is made by 'twinprobe plan' or 'twinprobe import pairs'\n");
  CHECK(std::filesystem::file_size(dir / "study.db") == 0);
  CHECK_FALSE(std::filesystem::exists(dir / "study.db-wal"));
}

TEST_CASE("issue 23: another SQLite database and a text file are refused unchanged") {
  testing::TempDir dir;
  SECTION("another database") {
    {
      auto s = Store::Open(dir / "other.db", true);  // a study store ...
      REQUIRE(s.ok());
    }
    // ... made into another database: no audit table, version 0.
    auto s = Store::Open(dir / "other.db", false);
    s.value()->Exec("DROP TABLE audit; PRAGMA user_version = 0");
    s.value().reset();
    std::filesystem::copy_file(dir / "other.db", dir / "study.db");
    const std::string before = FileDigest(dir / "study.db");
    auto r = RunCli({"--study", dir.path(), "verify"});
    CHECK(r.exit_code == 1);
    CHECK(r.err == "twinprobe: " + dir / "study.db" +
                       ": is not a study store (it has no twinprobe schema) \u2014 pass --study with the study "
                       "folder; a study store is made by 'twinprobe plan' or 'twinprobe import pairs'\n");
    CHECK(FileDigest(dir / "study.db") == before);
  }
  SECTION("a text file") {
    testing::WriteFile(dir / "study.db", "vacancy,arm,outcome\nV1,a,1\n");
    auto r = RunCli({"--study", dir.path(), "verify"});
    CHECK(r.exit_code == 1);
    CHECK(r.err == "twinprobe: " + dir / "study.db" +
                       ": is not a study store (it is not an SQLite database) \u2014 pass --study with the study folder; "
                       "a study store is made by 'twinprobe plan' or 'twinprobe import pairs'\n");
    CHECK(testing::ReadFile(dir / "study.db") == "vacancy,arm,outcome\nV1,a,1\n");
  }
}

TEST_CASE("issue 23: verify prints the head in full and never writes the store") {
  Study st;
  st.Record("P00001", "invitation");
  const std::string head = AuditHead(*st.s.Open());
  REQUIRE(head.size() == 64);
  const std::string before = FileDigest(st.s.db());
  auto r = st.Verify();
  CHECK(r.exit_code == 0);
  CHECK(r.out.find("; head " + head + "\n") != std::string::npos);
  CHECK(FileDigest(st.s.db()) == before);
}

TEST_CASE("issue 23: deleting the newest entries with their rows is caught with a witnessed head") {
  Study st;
  for (const char* p : {"P00001", "P00002", "P00003"}) st.Record(p, "invitation");
  const std::string head = st.VerifyJson()["head_hash"];  // entry 7, kept by the witness
  testing::WriteFile(st.s.dir / "witness.txt", "2027-03-06 ethics board copy\n2027-03-06 " + head + "\n");
  // Someone removes the last two records and their audit entries.
  st.Sql("DELETE FROM response WHERE audit_seq >= 6; DELETE FROM audit WHERE seq >= 6");
  CHECK(st.Verify().exit_code == 0);  // the chain alone cannot see it
  auto with_head = st.Verify({"--head", head});
  CHECK(with_head.exit_code == 1);
  CHECK(with_head.out == "The audit chain is BROKEN. First broken link: the store: the witnessed head " + head +
                             " (--head) is not in the chain: entries up to it were removed, or the chain was "
                             "rewritten.\n");
  auto with_file = st.VerifyJson({"--witness", st.s.dir / "witness.txt"});
  CHECK(with_file["ok"] == false);
  CHECK(with_file["witnessed"][0]["source"] == st.s.dir / "witness.txt:2");
  CHECK(with_file["witnessed"][0]["seq"].is_null());
}

TEST_CASE("issue 23: an intact chain names the entry a witnessed head is") {
  Study st;
  st.Record("P00001", "invitation");
  const std::string head = st.VerifyJson()["head_hash"];
  st.Record("P00002", "rejection");
  auto r = st.Verify({"--head", head});
  CHECK(r.exit_code == 0);
  CHECK(r.out.find("\n  witnessed head " + head + " (--head) is entry 5: nothing up to it was removed or rewritten\n") !=
        std::string::npos);
  auto bad = st.Verify({"--head", "cbe37d38"});
  CHECK(bad.exit_code == 2);
  CHECK(bad.err == "twinprobe: --head: 'cbe37d38' is not a chain head (a head is 64 hex digits) \u2014 copy the full "
                   "head that a writing command or 'twinprobe verify' printed\n");
  testing::WriteFile(st.s.dir / "empty-witness.txt", "nothing yet\n");
  auto none = st.Verify({"--witness", st.s.dir / "empty-witness.txt"});
  CHECK(none.exit_code == 1);
  CHECK(none.err == "twinprobe: " + st.s.dir / "empty-witness.txt" +
                        ":1: the witness file holds no chain head (64 hex digits) \u2014 write the head a writing "
                        "command printed into it, one per line\n");
}

TEST_CASE("issue 23: verify beside a recording writer never says BROKEN") {
  Study st(40);
  std::atomic<bool> done{false};
  int loop_status = -1;
  // A fieldworker records 40 responses while verify runs again and again.
  std::thread writer([&] {
    testing::WriteFile(st.s.dir / "loop.sh", "for i in $(seq 1 40); do '" + testing::BinaryPath() + "' --study '" +
                                                  st.s.path +
                                                  "' record $(printf 'P%05d' $i) invitation --at 2027-03-05 "
                                                  ">/dev/null 2>&1; done\n");
    loop_status = std::system(("bash '" + st.s.dir / "loop.sh" + "'").c_str());
    done = true;
  });
  int runs = 0, broken = 0;
  while (!done || runs < 5) {
    auto r = st.Verify();
    ++runs;
    if (r.exit_code != 0) {
      ++broken;
      UNSCOPED_INFO(r.out << r.err);
    }
  }
  writer.join();
  CHECK(loop_status == 0);
  CHECK(broken == 0);
  CHECK(runs >= 5);
  CHECK(st.s.Open()->QueryInt("SELECT count(*) FROM response") == 40);
}

TEST_CASE("issue 23: a command that writes prints the new head in full, text and JSON") {
  Study st;
  auto text = st.Record("P00001", "invitation");
  const std::string head = AuditHead(*st.s.Open());
  CHECK(text.out.size() > head.size());
  CHECK(text.out.substr(text.out.rfind("Audit head: ")) == "Audit head: " + head + "\n");
  auto json = RunCli({"--study", st.s.path, "--json", "record", "P00002", "rejection", "--at", "2027-03-05"}, kEnv);
  REQUIRE(json.exit_code == 0);
  auto j = nlohmann::json::parse(json.out);
  CHECK(j["audit_head"] == AuditHead(*st.s.Open()));
  CHECK(j["audit_head"] != head);
  // A command that only reads prints no head.
  CHECK(RunCli({"--study", st.s.path, "schedule"}).out.find("Audit head") == std::string::npos);
  auto analysis = nlohmann::json::parse(RunCli({"--study", st.s.path, "--json", "analyze"}).out);
  CHECK_FALSE(analysis.contains("audit_head"));
}

TEST_CASE("issue 23: two first-time imports into one empty folder do not race on creating the schema") {
  // Each round: two `import pairs` start at once on a folder with no store.
  for (int round = 0; round < 4; ++round) {
    testing::TempDir dir;
    const std::string study = dir / "s";
    std::string csv = "vacancy,arm,outcome\n";
    for (int v = 1; v <= 20; ++v)
      csv += "V" + std::to_string(v) + ",majority,1\nV" + std::to_string(v) + ",minority," + (v % 3 ? "0" : "1") + "\n";
    testing::WriteFile(dir / "a.csv", csv);
    testing::WriteFile(dir / "b.csv", csv + "V21,majority,0\nV21,minority,0\n");
    std::string script;
    for (const char* f : {"a", "b"})
      script += "'" + testing::BinaryPath() + "' --study '" + study + "' import pairs '" + dir / f + ".csv" +
                "' --reference majority >/dev/null 2>'" + dir / f + ".err' & ";
    script += "wait\n";
    testing::WriteFile(dir / "race.sh", script);
    REQUIRE(std::system(("bash '" + dir / "race.sh" + "'").c_str()) == 0);
    for (const char* f : {"a", "b"}) {
      const std::string err = testing::ReadFile(dir / f + ".err");
      INFO(f << ": " << err);
      CHECK(err.find("already exists") == std::string::npos);
      CHECK(err.find("not a usable study store") == std::string::npos);
    }
    auto v = RunCli({"--study", study, "verify"});
    INFO(v.out << v.err);
    CHECK(v.exit_code == 0);
  }
}

TEST_CASE("issue 23: a store of an older schema version verifies against that version and is not migrated") {
  Study st;
  st.Record("P00001", "invitation");
  // Exactly what migrations 1 to 3 made: version 4 only added this index;
  // versions 5 to 14 added tables, each with its indexes.
  st.Sql("DROP TABLE application_covariate; DROP TABLE merge_choice; DROP TABLE merged_row; DROP TABLE office_merge; DROP TABLE office_origin; "
         "DROP TABLE handout_vacancy; DROP TABLE handout; DROP TABLE level_design; DROP TABLE factor_design; "
         "DROP TABLE mail_excerpt_seal; DROP TABLE sending_detail; DROP TABLE monitor_look; DROP TABLE withdrawal; "
         "DROP TABLE material_file; DROP TABLE desk_passphrase; DROP INDEX response_supersedes; "
         "PRAGMA user_version = 3");
  auto j = st.VerifyJson();
  INFO(j.dump(2));
  CHECK(j["ok"] == true);
  CHECK(j["schema_version"] == 3);
  auto raw = Store::OpenReadOnly(st.s.db());
  REQUIRE(raw.ok());
  CHECK(raw.value()->schema_version() == 3);
}

TEST_CASE("issue 23: an edited review excerpt is caught, a purged one is not a break") {
  Study st;
  testing::WriteFile(st.s.path + "/in.mbox",
                     "From hanne.ostrel@orlinde-bakehouse.example Thu Mar  4 09:15:00 2027\n"
                     "From: Hanne Ostrel <hanne.ostrel@orlinde-bakehouse.example>\n"
                     "To: someone@postbox.example\n"
                     "Message-ID: <seal-1@orlinde-bakehouse.example>\n"
                     "Subject: Your application\n\n"
                     "We regret to tell you that the position has been filled.\n");
  auto mail = RunCli({"--study", st.s.path, "mail", "--mbox", st.s.path + "/in.mbox"}, kEnv);
  INFO(mail.err);
  REQUIRE(mail.exit_code == 0);
  auto intact = st.VerifyJson();
  REQUIRE(intact["ok"] == true);
  const int64_t seq = intact["entries"].get<int64_t>();
  CHECK(st.s.Open()->QueryInt("SELECT count(*) FROM mail_excerpt_seal") == 1);

  // What purge does: the excerpt emptied, its seal kept.
  st.Sql("UPDATE mail_message SET excerpt = NULL");
  CHECK(st.VerifyJson()["ok"] == true);

  st.Sql("UPDATE mail_message SET excerpt = '{\"text\":\"We would like to invite you to an interview.\"}'");
  auto text = st.Verify();
  CHECK(text.exit_code == 1);
  auto j = st.VerifyJson();
  CHECK(j["ok"] == false);
  CHECK(HasProblem(j, seq,
                   "the excerpt of mail_message row 1 was changed after it was written (it no longer matches "
                   "mail_excerpt_seal)"));

  // Removing the seal instead breaks the entry that wrote it.
  st.Sql("DELETE FROM mail_excerpt_seal");
  CHECK(st.VerifyJson()["ok"] == false);
}
