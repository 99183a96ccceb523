#pragma once
// Pre-registration (`freeze`): the SHA-256 of the canonical design
// (Design::canonical: study.toml as parsed, comments and layout aside) and of
// the canonical analysis plan (CanonicalAnalysisPlan in core/design.h) are
// stored in the study's meta table, with the plan's text itself so later
// deviations can be named item by item (analysis/deviations.h), and every
// input file of the analysis (the design file key by key, the vacancy file
// vacancy by vacancy, each name pool and template line by line:
// planner/freeze_inputs.h) so a later change is named by file and key.
//
// Meta keys and the record read back: core/read_freeze.h (one definition,
// shared with analysis/deviations.cpp).
#include "core/design.h"
#include "core/read_freeze.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// Stores the freeze in one audited write. Refuses (bad input, store
// unchanged) when the study was frozen before: a registration stands as made,
// later changes are deviations.
Result<FreezeRecord> FreezeStudy(Store& store, const Design& design);

}  // namespace twinprobe
