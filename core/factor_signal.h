#pragma once
// How a factor shows in the applications: through the applicant's name
// (the name pools are keyed by it, so the name and contact details differ
// between its levels) and through template fields it sets per level
// (fields = { birth_year = […] }). The design file says it (SignalOf); the
// store keeps it with the plan (core/read_design.h), so a report describes
// the signal of a study from the study itself, not always as "the name".
#include <string>
#include <vector>

#include "core/design.h"

namespace twinprobe {

struct FactorSignal {
  bool by_name = true;              // the name pools are keyed by the factor
  std::vector<std::string> fields;  // template fields the factor sets, sorted
};

FactorSignal SignalOf(const Design& design, const Factor& factor);

// In words, to follow "signalled by ": "the applicant's name and contact
// details", "the template fields birth_year and graduation_year", or both
// joined by "and" ("the applicant's name and contact details and the
// template field birth_year"); "no field" when neither (a design file
// refuses that).
std::string DescribeSignal(const FactorSignal& signal);

}  // namespace twinprobe
