#pragma once
// What the store remembers of the design beyond the fieldwork
// (core/fieldwork.h): the study's name, the outcome scheme and strata the
// plan was made with, the factors and levels (how each varies, display
// labels, scores and signal), profiles per arm and the
// number of employers (vacancies per stratum value: core/fieldwork.h). Counts and names only;
// nothing here identifies an employer.
#include <cstdint>
#include <map>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/factor_signal.h"
#include "core/import_files.h"

namespace twinprobe {

class Store;

struct StoredFactor {
  std::string name;
  std::vector<std::string> levels;  // in the order they were declared
  std::string reference;            // "" when none is marked
  bool between = false;             // varied between vacancies (each vacancy one level)
  std::string label;                // display label; "" = none
  std::vector<std::string> level_labels;  // per level; "" = none
  std::vector<double> scores;             // per level (ordered levels), or empty
  FactorSignal signal;                    // how the factor shows in the applications

  // The display label of the factor, else its name; of a level, else the level.
  std::string DisplayName() const { return label.empty() ? name : label; }
  std::string LevelLabel(const std::string& level) const;
};

struct StoredDesign {
  std::string study_id;  // "" when the store has none
  std::string title;     // "" when the store has none
  OutcomeScheme scheme;  // as stored with the plan (defaults when absent)
  bool has_window = false;  // the plan stored its observation window
  std::vector<std::string> strata_columns;  // as stored with the plan
  std::vector<StoredFactor> factors;        // of the current plan, by id
  std::map<int64_t, int64_t> profiles_by_arm;  // arm id -> fictitious applicants
  int64_t employers = 0;  // distinct employer pseudonyms among the plan's vacancies
  // The plan holds applicant records (`import applications`), not probes
  // that were sent: the report words them as what they are.
  bool records = false;
  // Hiring stages in order (`import applications --stages`; meta "stages"):
  // each application's outcome is the furthest stage it reached.
  std::vector<std::string> stages;
  // The files the records came from (core/import_files.h), read only when
  // `records`: what the data are, in place of a design hash and seed.
  std::vector<ImportedFile> imported_files;
};

// Reads the meta table and, when there is a current plan, its factors,
// profiles, strata and employers.
StoredDesign ReadStoredDesign(Store& store);

}  // namespace twinprobe
