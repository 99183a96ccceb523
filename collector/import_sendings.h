#pragma once
// `import sendings FILE.csv`: the field team's log of applications sent, so
// a season's sendings need not be typed one `sent` at a time. Columns:
// probe, sent_at (required), channel, by (optional); columns named reject_*
// are skipped (a corrected reject file imports as it is); any other column
// is reported as ignored. See docs/import.md.
//
// Every row goes through the checks of `sent` (collector/responses.h
// AddSending: known probe, readable time, the plausible-time rules of
// collector/time_rules.h, not after the probe's response) and the caller's
// material check (the rendered file is the current plan's). One row per
// probe. A row whose probe's newest sending already has that time adds
// nothing, so a log imported again after more rows were appended lands only
// the new rows. All or nothing: the first bad row fails the import and the
// store is left as it was; with skip_bad the good rows land and every bad
// row goes, with its reason, to the reject file. A file whose bytes were
// imported before adds nothing. One audit entry.
#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "collector/import_outcomes.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct SendingsImportSummary {
  int64_t rows_landed = 0;
  int64_t rows_rejected = 0;
  int64_t rows_unchanged = 0;     // the probe's newest sending already had that time
  bool already_imported = false;  // same file content imported before: nothing added
  std::string reject_path;        // "" when no row was rejected
  std::vector<std::string> ignored_columns;
  std::string audit_hash;
};

// Checks that the probe's rendered material is the one of the current plan
// (planner/materials_check.h, which the collector may not include); OK when
// the caller has none.
using MaterialCheck = std::function<Status(const std::string& probe_ref)>;

Result<SendingsImportSummary> ImportSendings(Store& store, const std::string& path, const ImportOptions& options,
                                             int early_days, const MaterialCheck& check_material);

}  // namespace twinprobe
