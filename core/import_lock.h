#pragma once
// One appending import at a time per study. `import pairs` checks a whole
// file against the study (pass 1) before it opens its write transaction
// (pass 2); two such imports at once both checked against the same study and
// the second failed inside SQLite with "UNIQUE constraint failed". The lock is
// an flock on a file beside the store (core/locked_file.h), released when the
// holder ends, however it ends (a killed import leaves no stale lock).
#include <string>

#include "core/locked_file.h"
#include "core/status.h"

namespace twinprobe {

// Held for as long as the value lives.
struct ImportLock {
  LockedFile file;
};

// Takes the import lock of the study whose store is `store_path` (the file
// STORE.import-lock, created without following a link, holding when and by
// whom the running import started). Fails at once, without waiting, when
// another import holds it: "STORE: another import is running in this study
// (started 2027-03-01T10:00:00Z by ana)", fix "try again when it ends".
Result<ImportLock> AcquireImportLock(const std::string& store_path);

}  // namespace twinprobe
