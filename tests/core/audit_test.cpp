#include <catch2/catch.hpp>

#include "core/audit.h"
#include "core/store.h"

using namespace twinprobe;

namespace {

void WriteMeta(Store& s, const std::string& key, const std::string& value) {
  AuditedWrite w(s, "test " + key);
  s.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES (?1, ?2, ?3)").Bind(1, key).Bind(2, value).Bind(3, w.seq()).Run();
  w.Commit("set " + key);
}

}  // namespace

TEST_CASE("audit: an untouched chain verifies and each entry links to the previous") {
  auto store = Store::Open(":memory:", true);
  Store& s = *store.value();
  WriteMeta(s, "a", "1");
  WriteMeta(s, "b", "2");
  WriteMeta(s, "c", "3");
  AuditReport r = VerifyAudit(s);
  CHECK(r.ok());
  CHECK(r.entries == 3);
  CHECK(r.sealed_rows == 3);
  CHECK(r.head_hash == AuditHead(s));
  CHECK(s.QueryInt("SELECT count(*) FROM audit a JOIN audit b ON b.seq = a.seq + 1 WHERE b.prev_hash = a.hash") == 2);
}

TEST_CASE("audit: verify catches a row edited behind the tool's back and names its entry") {
  auto store = Store::Open(":memory:", true);
  Store& s = *store.value();
  WriteMeta(s, "a", "1");
  WriteMeta(s, "b", "2");
  s.Exec("UPDATE meta SET value = 'tampered' WHERE key = 'b'");
  AuditReport r = VerifyAudit(s);
  REQUIRE_FALSE(r.ok());
  CHECK(r.problems.front().seq == 2);
  CHECK(r.problems.front().what.find("were changed, added or deleted") != std::string::npos);
}

TEST_CASE("audit: verify catches a deleted row, a slipped-in row and an edited audit entry") {
  auto store = Store::Open(":memory:", true);
  Store& s = *store.value();
  WriteMeta(s, "a", "1");
  WriteMeta(s, "b", "2");
  SECTION("deleted") {
    s.Exec("DELETE FROM meta WHERE key = 'a'");
    REQUIRE_FALSE(VerifyAudit(s).ok());
    CHECK(VerifyAudit(s).problems.front().seq == 1);
  }
  SECTION("slipped in under an existing entry") {
    s.Exec("INSERT INTO meta(key, value, audit_seq) VALUES ('x', 'y', 1)");
    CHECK(VerifyAudit(s).problems.front().seq == 1);
  }
  SECTION("slipped in under no entry") {
    s.Exec("INSERT INTO meta(key, value, audit_seq) VALUES ('x', 'y', 7)");
    AuditReport r = VerifyAudit(s);
    REQUIRE(r.problems.size() == 1);
    CHECK(r.problems.front().what == "rows carry audit seq 7 but no audit entry has it");
  }
  SECTION("audit summary edited") {
    s.Exec("UPDATE audit SET summary = 'nothing happened' WHERE seq = 1");
    AuditReport r = VerifyAudit(s);
    REQUIRE_FALSE(r.ok());
    CHECK(r.problems.front().seq == 1);
    CHECK(r.problems.front().what == "the entry itself was edited (its hash does not match its fields)");
  }
}
