#pragma once
// The flow of the study for the desk's Study page: how many probes of the
// current plan were planned, sent, answered, and how many positive
// responses were declined. Counts only; analysis stays in `analyze`.
#include <cstdint>

#include "core/design.h"
#include "core/store.h"

namespace twinprobe {

struct DeskCounts {
  int64_t planned = 0;    // probes of the current plan
  int64_t sent = 0;       // of them, with at least one sending
  int64_t responded = 0;  // with a current response (any code)
  int64_t positive = 0;   // whose current response is positive in `scheme`
  int64_t declined = 0;   // with at least one decline recorded
  int64_t entries = 0;    // audit entries (every write, any command)
};

DeskCounts ReadDeskCounts(Store& store, const OutcomeScheme& scheme);

}  // namespace twinprobe
