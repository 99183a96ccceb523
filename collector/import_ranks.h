#pragma once
// `import ranks`: ranked lists with each item's group, for a listing audit
// (docs/ranks.md), into the store's listing, listing_item, item_label and
// import_file tables in one AuditedWrite ("import ranks"). Used by the
// `import ranks` command and by `demo`, which imports the invented listings.
#include <cstdint>
#include <functional>
#include <map>
#include <string>
#include <vector>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// One list of the file: its rows in file order.
struct ParsedListing {
  std::string ref;
  std::map<std::string, std::string> attrs;  // listing-level columns as given
  int64_t first_line = 0;
  struct Item {
    int64_t position;
    std::string key;
    std::string fields;  // JSON
  };
  std::vector<Item> items;
};

// A checked ranks file: its bytes (hashed, so that a second import of the
// same bytes adds nothing) and what they say.
struct RanksFile {
  std::string path;
  std::string content;
  std::vector<ParsedListing> listings;
  std::vector<std::string> factors;
  std::map<std::string, std::map<std::string, std::string>> labels;  // item -> factor -> level
  int64_t rows = 0;
};

struct RankImportSummary {
  int64_t listings = 0, positions = 0, labels_added = 0, strata = 0;
  std::vector<std::string> factors;
  bool already_imported = false;  // the same bytes were imported before: nothing added
};

// Called after each list with (positions written, positions in the file).
using RankImportProgress = std::function<void(int64_t done, int64_t total)>;

// Reads and checks the CSV at `path` (columns listing, position, item, one
// column per protected factor, optionally query, location, seen_by, source,
// fetched_at, score; no page column: positions count from the top of the
// whole list) without touching a store, so a bad file never creates one.
// Errors name FILE:LINE.
Result<RanksFile> ReadRanksFile(const std::string& path);

// Writes a checked file in one AuditedWrite. Refuses (nothing written) an
// item whose label in the store differs from the file's. A file imported
// before adds nothing and sets `already_imported`.
Result<RankImportSummary> ImportRanks(Store& store, const RanksFile& file, const RankImportProgress& progress = {});

// ReadRanksFile, then ImportRanks. On any error nothing is written.
Result<RankImportSummary> ImportRanksFile(Store& store, const std::string& path,
                                          const RankImportProgress& progress = {});

}  // namespace twinprobe
