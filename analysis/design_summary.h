#pragma once
// The design as the store holds it, for the report's "design" section and
// its reproducibility stamp: factors and levels, arms, strata with their
// vacancy counts, the design hash and seed of the current plan, and the
// fieldwork period. Counts only; nothing here identifies an employer.
// Pure: built from core's read models (core/fieldwork.h, core/read_design.h).
#include <cstdint>
#include <map>
#include <string>
#include <vector>

#include "core/fieldwork.h"
#include "core/read_design.h"

namespace twinprobe {

struct DesignFactorSummary {
  std::string name;
  std::vector<std::string> levels;  // in the order they were declared
  std::string reference;            // the reference level ("" when none is marked)
  std::string signal;               // how its levels show in the applications, in words (DescribeSignal)
  bool between = false;             // varied between vacancies (each vacancy one level)
  std::string label;                // display label of the factor ("" = its name)
  std::vector<std::string> level_labels;  // per level ("" = the level itself)
};

struct DesignArmSummary {
  std::string label;
  bool is_reference = false;
  int64_t profiles = 0;        // fictitious applicants (identities) of this arm
  int64_t probes_planned = 0;  // probes of the current plan in this arm
};

struct StratumValueCount {
  std::string name;   // stratum column, e.g. "region"
  std::string value;  // e.g. "Orlinde"
  int64_t vacancies = 0;
};

struct DesignSummary {
  std::string design_sha256;  // SHA-256 of the design's canonical text when planned ("" for imports)
  int64_t seed = 0;
  bool has_seed = false;
  std::string plan_created_at;
  int window_days = 0;  // the observation window stored with the plan
  std::vector<DesignFactorSummary> factors;
  std::vector<DesignArmSummary> arms;  // reference first
  std::vector<std::string> strata_columns;
  std::vector<StratumValueCount> strata;  // by column, then value
  std::vector<std::string> templates;     // distinct templates used by the plan
  int64_t employers = 0;                  // distinct employer pseudonyms among the plan's vacancies
  std::string first_sent_at;              // fieldwork period ("" when nothing was sent)
  std::string last_sent_at;
  // Arm label -> its display text ("age=45,gender=f" -> "aged 45, f"), each
  // level through its display label (ArmDisplayText), every arm of the plan.
  std::map<std::string, std::string> arm_display;
  // Applicant records (`import applications`): the files they came from.
  // Such a plan has no design hash and no seed (has_seed is false).
  std::vector<ImportedFile> imported_files;
};

// The display text of an arm ("age=45,gender=f" -> "aged 45, f") with the
// stored factors' labels: the one rule, ArmDisplay in core/level_labels.h.
// With no factors: the levels without factor names.
std::string ArmDisplayText(const std::string& arm_label, const std::vector<StoredFactor>& factors);

// Empty when the fieldwork has no plan.
DesignSummary SummariseDesign(const Fieldwork& fieldwork, const StoredDesign& stored);

}  // namespace twinprobe
