#pragma once
// `import outcomes FILE.csv`: responses to the probes of the current plan,
// from a CSV file (RFC 4180, UTF-8). Columns: probe, code, received_at
// (required), channel, note (optional). Columns named reject_* are skipped
// (a corrected reject file imports as it is); any other column is reported
// as ignored. See docs/import.md.
//
// Every row goes through the same checks as `record` (collector/responses.h).
// Extra rules for a file: one row per probe; received_at may be empty only
// for the code 'none' (no response; stored without a time).
// All or nothing: the first bad row fails the import and the store is left
// as it was. With skip_bad the good rows land and every bad row goes, with
// its reason, to the reject file. A file whose bytes were imported before
// adds nothing.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct ImportOptions {
  bool skip_bad = false;
  std::string reject_path;  // with skip_bad: where bad rows go (default FILE.rejects.csv)
  bool raw_cells = false;   // reject file cells as they are, formula-like ones included
  bool progress = true;     // a progress bar on stderr when it is a terminal
};

struct ImportSummary {
  int64_t rows_landed = 0;
  int64_t rows_rejected = 0;
  int64_t late = 0;        // landed rows flagged 'late'
  int64_t superseding = 0; // landed rows that supersede an earlier response
  bool already_imported = false;  // same file content imported before: nothing added
  std::string reject_path;        // "" when no row was rejected
  std::vector<std::string> ignored_columns;
  std::string audit_hash;
};

Result<ImportSummary> ImportOutcomes(Store& store, const OutcomeScheme& scheme, const std::string& path,
                                     const ImportOptions& options);

}  // namespace twinprobe
