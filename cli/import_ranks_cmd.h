#pragma once
// `import ranks`: ranked lists with each item's group, for a listing audit
// (docs/ranks.md). Shared with `demo`, which imports the invented listings.
#include <cstdint>
#include <string>
#include <vector>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct RankImportSummary {
  int64_t listings = 0, positions = 0, labels_added = 0, strata = 0;
  std::vector<std::string> factors;
  bool already_imported = false;  // the same bytes were imported before: nothing added
};

// Reads and checks the CSV at `path` (columns listing, position, item, one
// column per protected factor, optionally query, location, seen_by, source,
// fetched_at, score; no page column: positions count from the top of the whole list), then writes it in one AuditedWrite. Errors name
// FILE:LINE; on any error nothing is written.
Result<RankImportSummary> ImportRanksFile(Store& store, const std::string& path);

}  // namespace twinprobe
