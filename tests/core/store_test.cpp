#include <catch2/catch.hpp>

#include "core/audit.h"
#include "core/schema.h"
#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;

TEST_CASE("store: migrations bring an empty file to the current schema version") {
  testing::TempDir dir;
  auto store = Store::Open(dir / "study.db", true);
  REQUIRE(store.ok());
  CHECK(store.value()->schema_version() == kSchemaVersion);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = 'response'") == 1);
  CHECK(store.value()->QueryInt("PRAGMA foreign_keys") == 1);
  Stmt mode = store.value()->Prepare("PRAGMA journal_mode");
  REQUIRE(mode.Step());
  CHECK(mode.Text(0) == "wal");
}

TEST_CASE("store: reopening an up-to-date store changes nothing") {
  testing::TempDir dir;
  { REQUIRE(Store::Open(dir / "study.db", true).ok()); }
  auto again = Store::Open(dir / "study.db", false);
  REQUIRE(again.ok());
  CHECK(again.value()->schema_version() == kSchemaVersion);
}

TEST_CASE("store: a missing store without create is a bad-input error naming the path") {
  testing::TempDir dir;
  auto store = Store::Open(dir / "none.db", false);
  REQUIRE_FALSE(store.ok());
  CHECK(store.error().Message() == dir / "none.db" +
                                       ": no study store here \u2014 run 'twinprobe plan' (or 'twinprobe import pairs') "
                                       "first, or pass --study DIR");
}

TEST_CASE("store: a store from a newer twinprobe is refused") {
  testing::TempDir dir;
  { auto s = Store::Open(dir / "study.db", true); s.value()->Exec("PRAGMA user_version = 999"); }
  auto store = Store::Open(dir / "study.db", false);
  REQUIRE_FALSE(store.ok());
  CHECK(store.error().what.find("schema version 999") != std::string::npos);
}

TEST_CASE("store: a transaction that is not committed leaves nothing behind") {
  auto store = Store::Open(":memory:", true);
  REQUIRE(store.ok());
  Store& s = *store.value();
  {
    AuditedWrite w(s, "test");
    s.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES ('k', 'v', ?1)").Bind(1, w.seq()).Run();
    // no Commit: destructor rolls back
  }
  CHECK(s.QueryInt("SELECT count(*) FROM meta") == 0);
  CHECK(s.QueryInt("SELECT count(*) FROM audit") == 0);
}
