#pragma once
// The store's schema as a file format (documented in docs/schema.md).
// Migrations are numbered; PRAGMA user_version holds the last one applied.
// Never renumber a migration or a stored code; add a new migration instead.
#include <string>
#include <vector>

namespace twinprobe {

class Store;

constexpr int kSchemaVersion = 14;  // bump together with a new migration

// Applies every migration above the store's user_version in one write
// transaction (BEGIN IMMEDIATE) that re-reads the version once it holds the
// lock: two processes creating the same new store queue, and the second finds
// the schema made. Throws StoreError on failure (the store keeps its version).
void Migrate(Store& store);

// One object of the schema as SQLite keeps it in sqlite_master.
struct SchemaObject {
  std::string type;  // table | index | view | trigger
  std::string name;
  std::string table;  // tbl_name: the table an index or trigger belongs to
  std::string sql;    // exact text ("" for SQLite's automatic indexes)
};

// The schema the migrations 1..`version` create, read back from a fresh
// in-memory database, ordered by type and name. Requires 1 <= version <=
// kSchemaVersion. verify compares a store's sqlite_master with it byte for
// byte, so a trigger, view or column added or changed behind the tool's
// back is found.
std::vector<SchemaObject> ReferenceSchema(int version);

// The schema objects of `store` (sqlite_master, without SQLite's internal
// sqlite_* tables), in the same order as ReferenceSchema.
std::vector<SchemaObject> StoredSchema(Store& store);

// A table whose rows are sealed into the audit chain, with the columns left
// out of its digest. Left-out columns are those `purge` may clear; each has a
// SHA-256 column beside it (e.g. response.note -> note_sha256) that is sealed.
struct SealedTable {
  std::string name;
  std::vector<std::string> unsealed_columns;
};
const std::vector<SealedTable>& SealedTables();

}  // namespace twinprobe
