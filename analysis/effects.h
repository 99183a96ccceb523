#pragma once
// The study's effect estimates and tests beyond the raw paired table: every
// comparison of an arm with the reference arm, per-stratum results corrected
// for multiplicity, and Mantel–Haenszel / Breslow–Day across strata.
// Pure: takes the complete sets as plain values (analysis/analyze.cpp gets
// them from core/fieldwork.h), so tests can build any study shape directly.
//
// How tables are formed (docs/methods.md, "Analysis of a study"):
//   paired / sets: for the reference arm R and each other arm X, the sets
//     holding a probe of both give a paired table (a both positive, b R
//     only, c X only, d neither); tests: exact McNemar (+ mid-p, asymptotic),
//     conditional odds ratio b/c with exact CI, net discrimination rates,
//     Newcombe paired difference.
//   unpaired: each probe is one observation; the arm x outcome 2x2 table of
//     R and X gives Fisher's exact test, the conditional MLE and the Woolf
//     sample odds ratio; every arm's rate has a Wilson interval.
//   strata: within each value of each stratum column the same test is run
//     (paired: exact McNemar and conditional OR; unpaired: Fisher); the p
//     values of one column and comparison form one family, adjusted with the
//     design's correction (R's p.adjust).
//   across strata: per stratum column, the arm x outcome 2x2 table of each
//     value (for paired data: R positive a+b, negative c+d; X positive a+c,
//     negative b+d) enters the Mantel–Haenszel odds ratio, the CMH test and
//     Breslow–Day/Tarone. Pairing is ignored there (probes are counted as
//     independent); the pair-respecting stratified estimate is MH over
//     vacancy-strata of size two, which reduces to sum(b)/sum(c), i.e. the
//     overall conditional odds ratio reported with the paired table.
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "stats/adjust.h"
#include "stats/fisher.h"
#include "stats/mcnemar.h"
#include "stats/paired.h"
#include "stats/stratified.h"

namespace twinprobe {

// `count` complete sets of one shape: their probes (arm index into
// EffectsInput::arm_labels, 0 = reference; positive outcome) and the
// vacancy's strata (column, value). Sets of the same shape are given once
// with their count, so the input grows with shapes, not with sets.
struct SetOutcome {
  std::vector<std::pair<int, bool>> probes;
  std::vector<std::pair<std::string, std::string>> strata;
  int64_t count = 1;
};

struct EffectsInput {
  std::string kind = "paired";           // paired | sets | unpaired
  std::vector<std::string> arm_labels;   // [0] is the reference arm
  std::vector<SetOutcome> sets;          // complete sets only
  double confidence = 0.95;
  std::string correction = "holm";       // as the design's [analysis].correction
};

// A test of one arm against the reference, on all data or within a stratum.
struct ArmComparison {
  std::string other_label;
  bool paired = true;
  // paired / sets
  stats::PairedCounts pairs;
  stats::McNemarResult mcnemar;
  stats::Estimate conditional_or;
  stats::NetDiscrimination net;
  // unpaired
  stats::Table2x2 table;  // rows reference / other, columns positive / negative
  stats::FisherResult fisher;
  stats::SampleOddsRatio woolf;
  stats::Interval reference_wilson, other_wilson;
  // the headline p (exact McNemar or two-sided Fisher) and its adjusted value
  stats::PValue p;
  double p_adjusted = 1;
};

struct StratumComparison {
  std::string column;  // e.g. "occupation"
  std::string value;   // e.g. "bookkeeper"
  ArmComparison result;
};

struct AcrossStrata {
  std::string column;
  std::string other_label;
  int values = 0;                     // stratum values (tables)
  std::vector<stats::Table2x2> tables;  // arm x outcome per value, in value order
  stats::MantelHaenszelResult mh;
  stats::BreslowDayResult breslow_day;
};

struct Effects {
  std::string correction;  // the method actually applied ("none" when the design says none)
  std::vector<ArmComparison> comparisons;  // one per non-reference arm, adjusted across arms
  std::vector<StratumComparison> strata;   // per column, comparison and value; adjusted within column x comparison
  std::vector<AcrossStrata> across;        // per column and comparison
};

// Requires arm_labels.size() >= 2 for any comparison (else empty results),
// 0 < confidence < 1. An unknown correction name is treated as "none" and
// reported as such (the design parser rejects unknown names earlier).
Effects ComputeEffects(const EffectsInput& input);

}  // namespace twinprobe
