#pragma once
// Pre-registration: what `freeze` stored (core/read_freeze.h) compared with the
// design and analysis plan in use now. Every difference is a deviation; the
// results it touches are exploratory, not confirmatory.
//
// Deviations found:
//   design_edited            study.toml's canonical form changed after the freeze
//   plan_from_other_design   the current plan was made from another design
//   frozen_after_fieldwork   probes were sent or responses recorded before the freeze
//   stratum_added / stratum_removed
//   correction_changed       a multiple-comparison method other than the frozen one
//   alpha_changed
//   primary_outcome_changed  primary outcome, its positive codes, codes or window
//   arms_changed             kind, arms or reference arm
//   looks_changed            planned interim looks
//   spending_changed         the spending function of the monitoring plan
//   input_changed            an input file (the design, the vacancy file, a
//                            name pool, a template) differs from the frozen one,
//                            named by file and key (input_added / input_removed
//                            for a file the design now names or no longer names)
//   monitor_spending         a stored monitor look used a spending function
//                            other than the frozen one (`monitor --spending`)
#include <string>
#include <vector>

#include <optional>

#include "core/design.h"
#include "core/fieldwork.h"
#include "core/monitor_looks.h"
#include "core/read_design.h"
#include "core/read_freeze.h"

namespace twinprobe {

struct Deviation {
  std::string kind;  // one of the names above
  std::string what;  // a sentence for the report
  std::string file;  // the file it concerns ("study.toml", "vacancies.csv", …); "" when none
  std::vector<std::string> keys;  // the keys changed in it (design keys, vacancy ids, "line 7"); may be empty
};

struct ExploratoryItem {
  std::string what;  // the result, e.g. "tables by stratum 'firm_size'"
  std::string why;   // e.g. "the stratum is not in the frozen plan"
};

struct PreregistrationStatus {
  bool frozen = false;
  std::string frozen_at;
  std::string design_sha256;           // as frozen
  std::string analysis_sha256;         // as frozen
  std::string current_design_sha256;   // "" when no design file was available
  std::string current_analysis_sha256;
  std::vector<std::string> frozen_strata;
  std::vector<Deviation> deviations;
  std::vector<ExploratoryItem> exploratory;

  // True when the study is frozen and `stratum` is not among the frozen strata.
  bool IsExploratoryStratum(const std::string& stratum) const;
};

// `freeze` is what the store holds (core/read_freeze.h); `stored` and
// `fieldwork` are what it remembers of the design and plan (compared when
// there is no design file); `current` is the design file as it is now
// (nullptr when the study has none, e.g. imported data); `used` is the
// analysis plan the analysis runs with; `looks` the monitor looks taken
// (core/monitor_looks.h). Input files are compared when both the freeze and
// `current` carry them (Design::inputs, freeze.inputs).
PreregistrationStatus CheckPreregistration(const std::optional<FreezeRecord>& freeze, const StoredDesign& stored,
                                           const Fieldwork& fieldwork, const Design* current, const AnalysisPlan& used,
                                           const std::vector<StoredLook>& looks = {});

}  // namespace twinprobe
