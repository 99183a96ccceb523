#pragma once
// The store's schema as a file format (documented in docs/schema.md).
// Migrations are numbered; PRAGMA user_version holds the last one applied.
// Never renumber a migration or a stored code; add a new migration instead.
#include <string>
#include <vector>

namespace twinprobe {

class Store;

constexpr int kSchemaVersion = 5;  // bump together with a new migration

// Applies every migration above the store's user_version, each in its own
// transaction. Throws StoreError on failure (leaving the store at the last
// version that applied cleanly).
void Migrate(Store& store);

// A table whose rows are sealed into the audit chain, with the columns left
// out of its digest. Left-out columns are those `purge` may clear; each has a
// SHA-256 column beside it (e.g. response.note -> note_sha256) that is sealed.
struct SealedTable {
  std::string name;
  std::vector<std::string> unsealed_columns;
};
const std::vector<SealedTable>& SealedTables();

}  // namespace twinprobe
