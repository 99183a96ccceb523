#pragma once
// The warning for values that differ only in case or spaces
// (core/near_duplicates.h), one line per group, shared by `import pairs`,
// `check` and `plan` so the wording is the same everywhere.
#include <string>
#include <vector>

#include "core/near_duplicates.h"

namespace twinprobe {

// e.g. "the column 'region' holds 'Harbour coast' (3 rows) and 'Harbour
// Coast' (1 row), which differ only in case or spaces and so count as two
// values; write them alike if they are one". `one`/`many` name what is
// counted ("row"/"rows", "vacancy"/"vacancies").
std::string NearDuplicateWarning(const NearDuplicate& d, const std::string& one, const std::string& many);

// Warns (stderr) once per group.
void WarnNearDuplicates(const std::vector<NearDuplicate>& found, const std::string& one, const std::string& many);

}  // namespace twinprobe
