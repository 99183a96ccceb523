#pragma once
// Everything `check` verifies before a plan can be made: the design file,
// the vacancies file and the name pools, read and cross-checked; then the
// plan the seed gives, made in memory, and the proof that the probes of every
// set differ only in what a factor controls (planner/one_difference.h).
#include <map>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/near_duplicates.h"
#include "core/status.h"
#include "planner/assign.h"
#include "planner/materials.h"
#include "planner/one_difference.h"
#include "planner/template_text.h"
#include "planner/vacancies.h"

namespace twinprobe {

struct CheckedStudy {
  Design design;
  std::vector<Vacancy> vacancies;
  std::vector<NameList> pools;
  // Stratum or employer values of the vacancies file that differ only in
  // case or spaces (counted in vacancies); `check` and `plan` warn.
  std::vector<NearDuplicate> near_duplicates;
};

// Reads and validates the study folder; the first problem found is returned.
// A listing audit (kind = "listing") has only its design read and checked.
Result<CheckedStudy> CheckStudy(const std::string& study_dir);

struct StudyProof {
  Plan plan;  // what `plan` would store
  std::map<std::string, TemplateDoc> templates;
  std::vector<ProbeMaterial> materials;
  OneDifferenceReport report;  // leaks, if any, are in report.leaks
};

// Assigns the plan in memory and runs the one-difference proof on it. Hard
// errors (assignment impossible, a template that cannot be read, an unknown
// field, a listing audit, which has nothing to plan) come back as the error.
Result<StudyProof> ProveStudy(const std::string& study_dir, const CheckedStudy& study);

}  // namespace twinprobe
