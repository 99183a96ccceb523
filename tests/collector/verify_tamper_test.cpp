// `verify` catches a response edited behind the tool's back (the audit
// chain, core/audit.h), through the real binary on a real study.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// A planned study with its sendings (audit entry 2) and three recorded
// responses (audit entries 3, 4, 5).
struct RecordedStudy {
  testing::PlannedStudy s;
  RecordedStudy() {
    testing::WriteFile(s.dir / "sendings.csv", "probe,sent_at\nP00001,2027-03-02\nP00002,2027-03-02\nP00003,2027-03-02\n");
    REQUIRE(RunCli({"--study", s.path, "import", "sendings", s.dir / "sendings.csv"},
                   {"TWINPROBE_ACTOR=ana", "TWINPROBE_NOW=2027-03-06T08:00"})
                .exit_code == 0);
    for (auto [probe, code] : {std::pair{"P00001", "rejection"}, {"P00002", "invitation"}, {"P00003", "none"}}) {
      auto r = RunCli({"--study", s.path, "record", probe, code, "--at", "2027-03-05", "--note", "noted"},
                      {"TWINPROBE_ACTOR=ana", "TWINPROBE_NOW=2027-03-06T08:00"});
      REQUIRE(r.exit_code == 0);
    }
  }
  void Tamper(const std::string& sql) { s.Open()->Exec(sql); }
  nlohmann::json Verify() { return nlohmann::json::parse(RunCli({"--study", s.path, "--json", "verify"}).out); }
};

}  // namespace

TEST_CASE("verify: an intact chain after recording passes") {
  RecordedStudy r;
  auto text = RunCli({"--study", r.s.path, "verify"});
  CHECK(text.exit_code == 0);
  CHECK(text.out.rfind("The audit chain is intact: 5 entries sealing ", 0) == 0);
}

TEST_CASE("verify: a response code changed in the file is the first broken link, with its author") {
  RecordedStudy r;
  r.Tamper("UPDATE response SET code = 'invitation' WHERE id = 1");  // rejection -> invitation
  auto text = RunCli({"--study", r.s.path, "verify"});
  CHECK(text.exit_code == 1);
  CHECK(text.out == "The audit chain is BROKEN. First broken link: entry 3: rows written by this entry (record) were "
                    "changed, added or deleted since (tables now holding them: response).\n"
                    "  entry 3 was written by ana at 2027-03-06T08:00:00Z: record P00001 rejection\n"
                    "  also entry 3: its summary says 'record P00001 rejection' but the rows it sealed say 'record "
                    "P00001 invitation'\n");
  auto j = r.Verify();
  CHECK(j["ok"] == false);
  CHECK(j["problems"].size() == 2);  // the digest, and the summary that no longer matches the row
  CHECK(j["problems"][0]["seq"] == 3);
  CHECK(j["problems"][0]["actor"] == "ana");
  CHECK(j["problems"][0]["command"] == "record");
}

TEST_CASE("verify: a deleted response, a slipped-in response and a rewritten note are caught") {
  RecordedStudy r;
  SECTION("deleted") {
    r.Tamper("DELETE FROM response WHERE id = 2");
    auto j = r.Verify();
    CHECK(j["problems"][0]["seq"] == 4);
    CHECK(j["problems"][0]["what"] == "rows written by this entry (record) were changed, added or deleted since (no "
                                      "rows remain)");
  }
  SECTION("slipped in under an existing entry") {
    r.Tamper("INSERT INTO response(probe_id, code, origin, entered_by, entered_at, audit_seq) "
             "SELECT id, 'offer', 'record', 'ana', '2027-03-06T08:00:00Z', 4 FROM probe WHERE ref = 'P00009'");
    CHECK(r.Verify()["problems"][0]["seq"] == 4);
  }
  SECTION("a note rewritten (notes sit outside the digest, but their SHA-256 is sealed)") {
    r.Tamper("UPDATE response SET note = 'nothing happened' WHERE id = 3");
    auto j = r.Verify();
    REQUIRE(j["problems"].size() == 1);
    CHECK(j["problems"][0]["seq"] == 5);
    CHECK(j["problems"][0]["what"] ==
          "the note of response row 3 was changed after it was written (it no longer matches note_sha256)");
  }
  SECTION("a note emptied, as purge does, is not a break") {
    r.Tamper("UPDATE response SET note = NULL WHERE id = 3");
    CHECK(r.Verify()["ok"] == true);
  }
  SECTION("the audit row itself rewritten to match a forged code") {
    r.Tamper("UPDATE response SET code = 'offer' WHERE id = 1");
    r.Tamper("UPDATE audit SET summary = 'record P00001 offer' WHERE seq = 3");
    auto j = r.Verify();
    CHECK(j["problems"][0]["seq"] == 3);
    CHECK(j["problems"][0]["what"] == "the entry itself was edited (its hash does not match its fields)");
  }
}
