#pragma once
// The one rule for which designs `monitor` can watch: interim looks are a
// group-sequential exact McNemar test (analysis/monitor.h), so they need a
// set of two probes per vacancy and two arms in all. `check` and `freeze`
// (through the design reader) refuse [analysis].looks in any other design,
// naming why, instead of letting `monitor` refuse it mid-fieldwork.
#include <string>

#include "core/design.h"

namespace twinprobe {

// "" when monitor can watch the design; otherwise the reason, as a clause
// that follows "but " in a message.
std::string MonitorRefusal(const Design& design);

}  // namespace twinprobe
