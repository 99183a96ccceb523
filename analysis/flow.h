#pragma once
// The flow of the study (a participant flow, as trial reporting guidelines
// draw it): the vacancies planned, the sets with every application sent,
// those closed (every probe answered within its window or its window over)
// and those analysed, with each exclusion counted by its reason. Computed
// from the counts core's read model returns (core/fieldwork.h), at the study
// clock the reading was made with.
#include <cstdint>
#include <string>
#include <vector>

#include "core/fieldwork.h"

namespace twinprobe {

struct FlowExclusion {
  std::string reason;  // not_sent | incomplete | withdrawn | still_open
  std::string label;   // plain words for the text and the diagram
  int64_t sets = 0;
};

struct StudyFlow {
  int64_t vacancies_planned = 0;
  int64_t sets_sent = 0;      // every application of the set sent (or an imported outcome)
  int64_t sets_closed = 0;    // of those, every probe closed
  int64_t sets_analysed = 0;  // of those, in the primary analysis
  int window_days = 0;
  std::vector<FlowExclusion> exclusions;  // in flow order, each with its count (zero counts kept)
  int64_t probes_open = 0;                // sent probes still within their window
  int64_t responses_late = 0;             // answers after the window (kept, count as no answer)
};

StudyFlow ComputeFlow(const Fieldwork& f, int window_days);

}  // namespace twinprobe
