#pragma once
// The one sentence that states a monitoring decision. `monitor` prints it as
// text and puts the same string in its JSON (`decision_text`), so the two can
// never say different things (issue 16: the text said "continue" where the
// JSON said "waiting"). It begins "Decision: " followed by the decision's
// code word (waiting, continue, stop, final) or, at a crossed final look,
// "the final analysis crosses the boundary".
#include <string>

#include "analysis/monitor.h"

namespace twinprobe {

std::string MonitorDecisionText(const MonitorResult& m, double alpha, const std::string& reference_label,
                                const std::string& other_label);

}  // namespace twinprobe
