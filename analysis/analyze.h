#pragma once
// Runs the study's analysis on what core's read models return
// (core/read_study.h) and returns one plain value holding every number a
// report shows (report/ never recomputes). Pure: no store, no SQL.
//
// What counts: the current plan's probes; a probe's outcome is its current
// response (the newest of a correction chain); a probe with no response is a
// negative outcome ("none") once it was sent. A set enters the paired table
// only when it is complete (IsSetComplete in core/fieldwork.h: every probe
// is closed: answered within its window, its window over at the study clock,
// or, for imported data, carrying an outcome). An answer after the window is
// late and counts as no answer everywhere (rates, paired table, response
// times, employers, monitor).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "analysis/declines.h"
#include "analysis/balance.h"
#include "analysis/deviations.h"
#include "analysis/early_stop.h"
#include "analysis/listing_analysis.h"
#include "analysis/adjusted_model.h"
#include "analysis/covariate_model.h"
#include "analysis/effects.h"
#include "analysis/k_level.h"
#include "core/design.h"
#include "core/status.h"
#include "core/read_study.h"
#include "analysis/design_summary.h"
#include "analysis/employer_outcomes.h"
#include "analysis/employer_sets.h"
#include "analysis/flow.h"
#include "analysis/response_times.h"
#include "analysis/stages.h"
#include "stats/binomial.h"
#include "stats/impact.h"
#include "stats/mcnemar.h"

namespace twinprobe {

struct ArmResult {
  std::string label;
  bool is_reference = false;
  int64_t probes = 0;      // probes in analysed sets
  int64_t positive = 0;    // positive callbacks
  double rate = 0;         // positive / probes
  stats::Interval ci;      // Clopper–Pearson at the study's confidence
};

struct StratumTable {
  std::string name;   // stratum column, e.g. "occupation"
  std::string value;  // e.g. "bookkeeper"
  stats::PairedCounts table;
};

struct AnalysisResult {
  std::string study_id;
  std::string title;
  std::string kind;            // paired | sets | unpaired
  std::string plan_origin;     // plan | import
  bool records = false;        // applicant records (import applications), not probes sent
  double confidence = 0.95;    // 1 - alpha
  double alpha = 0.05;
  std::string correction;      // the design's multiple-comparison method
  std::vector<std::string> positive_codes;

  int64_t vacancies = 0;
  int64_t probes_planned = 0;
  int64_t probes_sent = 0;
  int64_t responses = 0;        // current responses
  int64_t responses_superseded = 0;
  int64_t sets_analysed = 0;
  int64_t sets_incomplete = 0;  // sets left out because a probe was not sent
  int64_t sets_open = 0;        // sets left out because a probe is still within its window
  int64_t responses_late = 0;   // answers after the window (kept, counted as no answer)
  StudyFlow flow;               // analysis/flow.h

  std::vector<ArmResult> arms;  // reference first
  // Unpaired designs: each arm's selection rate over the highest arm's
  // (stats/impact.h; the 29 CFR 1607.4(D) reading), in arm order.
  std::vector<stats::ImpactRatio> impact_vs_highest;
  HiringStages stages;  // analysis/stages.h (records imported with --stages)

  // Paired design: reference arm vs the other arm.
  bool has_paired = false;
  std::string reference_label;
  std::string other_label;
  stats::PairedCounts paired;
  double mcnemar_exact_p = 1;
  std::vector<StratumTable> strata;  // the paired table within each stratum value

  ListingAudit listings;  // ranked lists (import ranks, fetch); present = false when there are none
  // Every comparison with the reference arm, per-stratum tests corrected for
  // multiplicity, Mantel–Haenszel and Breslow–Day (analysis/effects.h).
  Effects effects;
  // A factor with three or more levels, or two factors: overall, pairwise,
  // trend and two-factor tests (analysis/k_level.h; present = false otherwise).
  KLevelAnalysis k_levels;
  // Paired and sets designs: the arm effect adjusted for template and send
  // position by conditional logistic regression (analysis/adjusted_model.h).
  AdjustedModel adjusted;
  // Records imported with --covariates: each group's odds ratio adjusted for
  // them by logistic regression (analysis/covariate_model.h).
  CovariateModel covariate_model;
  DesignSummary design;              // analysis/design_summary.h
  ResponseTimes response_times;      // analysis/response_times.h
  EmployerOutcomes employers;        // analysis/employer_outcomes.h (pseudonyms only)
  EmployerSetsSummary employer_sets; // sets of three or more probes (analysis/employer_sets.h)
  BalanceReport balance;                   // arm x template / send order / stratum / weekday (analysis/balance.h)
  PreregistrationStatus preregistration;  // freeze and deviations from it (analysis/deviations.h)
  EarlyStop early_stop;                   // after a stored monitor stop (analysis/early_stop.h)
  DeclineCounts declines;                 // positive responses declined on time or not (analysis/declines.h)
};

// Requires a plan in the reading, or listings (a listing-only store gives
// kind "listing" and only `listings`); fails with a bad-input error naming
// `store_path` otherwise. `scheme` must be the one the reading was made
// with. `plan` supplies alpha and the correction. `current_design` (the
// study.toml in use, nullptr if none) is compared with the frozen design to
// list deviations.
Result<AnalysisResult> Analyze(const StudyReading& reading, const std::string& store_path, const OutcomeScheme& scheme,
                               const AnalysisPlan& plan, const Design* current_design = nullptr);

}  // namespace twinprobe
