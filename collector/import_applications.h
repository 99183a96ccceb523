#pragma once
// `import applications FILE.csv`: applicant records (an HR department's
// pipeline, a newsroom's spreadsheet of applications and outcomes) as a
// study, one row per application. It is `import pairs` (collector/
// import_pairs.h) with the file's own column names mapped, the kind chosen
// by the user rather than by the number of groups, free outcome values with
// the positive ones named, and a study marked as made of records, so the
// report never calls them fictitious or sent. See docs/import.md.
//
// Kinds:
//   paired    two groups, one application of each per vacancy;
//   sets      one application of each group per vacancy;
//   unpaired  any number of applications of any group per vacancy; the
//             vacancy column is optional and, when present, also a stratum
//             ("vacancy"), so the analysis compares groups within vacancies.
#include <string>
#include <utility>
#include <vector>

#include "collector/import_pairs.h"
#include "core/status.h"

namespace twinprobe {

struct ApplicationsImportOptions {
  std::string kind;       // paired | sets | unpaired (required)
  std::string columns;    // --columns arm=group,outcome=invited,vacancy=req_id
  std::string factor;     // --factor NAME (default "group")
  std::string positive;   // --positive yes,invited (comma-separated)
  std::string stages;     // --stages applied,screened,interview,offer,hire: a yes/no column per stage, or the outcome is the furthest stage reached
  std::string covariates;  // --covariates years,degree (the file's column names)
  std::string scores;      // --scores a28=28,a45=45,a58=58 (ordered groups)
  PairsImportOptions base;  // strata, reference, skip_bad, rejects, id, progress
};

// "arm=group,outcome=invited" as (role, column) pairs. A bad-input error
// (where "--columns") names an unknown role, a repeated one or an entry
// without '='.
Result<std::vector<std::pair<std::string, std::string>>> ParseColumnMap(const std::string& text);

// "a28=28,a45=45" as (level, score) pairs. A bad-input error (where
// "--scores") names an entry without '=', a score that is not a finite
// number or a level given twice.
Result<std::vector<std::pair<std::string, double>>> ParseScores(const std::string& text);

// Checks the options, then imports as ImportPairs does (same store rules:
// all or nothing, --skip-bad, a file imported before adds nothing).
Result<PairsImportSummary> ImportApplications(const std::string& store_path, const Design* design,
                                              const std::string& path, const ApplicationsImportOptions& options);

}  // namespace twinprobe
