#pragma once
// Linking listing items to groups (table item_label: item key -> factor
// level), so rank statistics can compare groups. Two ways in:
//  - a labels file supplied by the user: CSV with a column item_key and one
//    column per factor, e.g.
//        item_key,origin
//        cand-0412,coastal
//    (an empty cell leaves that factor unknown for the item);
//  - the study's own profiles, when it probes a listing with them: each
//    profile's display name becomes an item key labelled with its arm's
//    levels (so the source's key field must extract the displayed name).
// A later label for the same item key and factor wins; earlier ones stay.
#include <cstdint>
#include <string>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct LabelImport {
  int64_t labels = 0;  // item_label rows added
  int64_t items = 0;   // distinct item keys
  bool already_imported = false;  // the same file content was imported before: nothing added
  std::string audit_hash;
};

// `import labels FILE.csv`. When the design declares factors, every factor
// column must be one of them and every level one of its levels; errors name
// FILE:LINE. All or nothing, in one AuditedWrite.
Result<LabelImport> ImportLabels(Store& store, const Design* design, const std::string& path);

// `import labels --from-profiles`: labels from the current plan's profiles.
// Fails if the store holds no plan with profiles.
Result<LabelImport> LabelsFromProfiles(Store& store);

}  // namespace twinprobe
