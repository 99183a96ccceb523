#pragma once
// The head of a plan in the store: a plan row, the study's meta (id, title,
// outcome scheme, strata), its factors, levels and arms. Shared by `plan` and
// by imports that create a study from data (`import pairs`).
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/stored_codes.h"

namespace twinprobe {

class Store;

// Inserts the plan header under audit entry `seq` (call inside an
// AuditedWrite). Returns the new plan id and fills `arm_ids` with the arms'
// row ids in design order. Throws StoreError when `design.kind` is not a
// stored design kind (the design file and the imports check it first, so
// only a bug gets there).
int64_t StorePlanHeader(Store& store, int64_t seq, PlanOrigin origin, const Design& design,
                        std::vector<int64_t>& arm_ids);
// The same with the origin by its stored spelling ("plan" or "import");
// throws StoreError on any other. Kept for callers not yet on PlanOrigin.
int64_t StorePlanHeader(Store& store, int64_t seq, const std::string& origin, const Design& design,
                        std::vector<int64_t>& arm_ids);

}  // namespace twinprobe
