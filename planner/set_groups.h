#pragma once
// Which arms go to one vacancy. A factor varied within vacancies puts every
// one of its levels into each set; a factor varied between vacancies gives
// each vacancy one of its levels. So the arms fall into groups, one per
// combination of the between factors' levels, and a vacancy receives the
// arms of one group (its set). Without between factors there is one group
// holding every arm. In an unpaired design each vacancy receives one probe
// and this grouping is not used.
#include <map>
#include <string>
#include <vector>

#include "core/design.h"

namespace twinprobe {

struct SetGroup {
  std::map<std::string, std::string> between;  // between factor -> level ({} without between factors)
  std::vector<int> arms;  // indices into design.arms, in design order
};

// The groups in the order their first arm appears in design.arms.
std::vector<SetGroup> SetGroups(const Design& design);

// The arm's levels of the within factors, as "origin=coastal" (factors
// sorted by name, joined by ","; "" when no factor varies within).
std::string WithinLabel(const Design& design, const Arm& arm);

}  // namespace twinprobe
