#pragma once
// Everything `check` verifies before a plan can be made: the design file,
// the vacancies file and the name pools, read and cross-checked.
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "planner/assign.h"
#include "planner/vacancies.h"

namespace twinprobe {

struct CheckedStudy {
  Design design;
  std::vector<Vacancy> vacancies;
  std::vector<NameList> pools;
};

// Reads and validates the study folder; the first problem found is returned.
Result<CheckedStudy> CheckStudy(const std::string& study_dir);

}  // namespace twinprobe
