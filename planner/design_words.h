#pragma once
// The design in words, as `check` prints it: how each factor varies, e.g.
// "origin varies within each vacancy (2 levels); gender is assigned between
// vacancies (2 levels, balanced within region)".
#include <string>

#include "core/design.h"

namespace twinprobe {

// Factors in design order, joined by "; ". In an unpaired design every
// factor is assigned between vacancies (one probe each). The strata named
// are [strata].columns (the randomisation blocks); without strata the
// balance is "over the plan".
std::string DescribeVariation(const Design& design);

// The arms' codes with their display labels, as `plan` prints them above
// the balance tables that name arms by code: "Arms by their display labels:
// age=28,gender=f = aged 28, woman; …". "" when no factor has labels.
std::string DescribeArmLabels(const Design& design);

}  // namespace twinprobe
