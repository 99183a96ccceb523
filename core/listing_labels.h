#pragma once
// Item labels (table item_label: item key -> level of a factor) and the
// import_file rows of the listing importers (`import labels`, `import
// ranks`). The rules (which labels are allowed, that an item keeps its
// group) are the collector's: collector/listing_labels.h,
// collector/import_ranks.h. Writers run inside the caller's AuditedWrite.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/store.h"
#include "core/stored_codes.h"

namespace twinprobe {

// Appends labels; the statement is prepared once for a whole import. A later
// label for the same item key and factor wins; earlier ones stay.
class ItemLabelWriter {
 public:
  explicit ItemLabelWriter(Store& store);
  void Insert(int64_t seq, const std::string& item_key, const std::string& factor, const std::string& level);

 private:
  Stmt insert_;
};

// The label in force for (item, factor) and the audit entry that wrote it.
struct StoredItemLabel {
  std::string level;
  int64_t audit_seq = 0;
};

// Looks up the label in force; prepared once for a whole import.
class ItemLabelReader {
 public:
  explicit ItemLabelReader(Store& store);
  std::optional<StoredItemLabel> Current(const std::string& item_key, const std::string& factor);

 private:
  Stmt select_;
};

// A profile of the current plan with one level of its arm.
struct ProfileLabelRow {
  std::string display_name;
  std::string factor;
  std::string level;
};

// Every (profile, factor, level) of the current plan, by profile then factor.
std::vector<ProfileLabelRow> ReadProfileLabels(Store& store);

// True when a file with this SHA-256 was imported before by importer `kind`.
bool ListingFileImported(Store& store, ImportKind kind, const std::string& sha256);

// Records an imported file (rows_rejected 0: the listing imports are all or
// nothing).
void RecordListingFile(Store& store, int64_t seq, ImportKind kind, const std::string& sha256, const std::string& path,
                       int64_t rows_landed);

}  // namespace twinprobe
