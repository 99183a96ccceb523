#pragma once
// The study's effect estimates and tests beyond the raw paired table: every
// comparison of an arm with the reference arm, per-stratum results corrected
// for multiplicity, and one analysis across strata per stratum column.
// Pure: takes the complete sets as plain values (analysis/analyze.cpp gets
// them from core/fieldwork.h), so tests can build any study shape directly.
//
// How tables are formed (docs/methods.md, "Analysis of a study"):
//   paired / sets: for the reference arm R and each other arm X, the sets
//     holding a probe of both give a paired table (a both positive, b R
//     only, c X only, d neither); tests: exact McNemar (+ mid-p, asymptotic),
//     conditional odds ratio b/c with exact and mid-p CI, the callback-rate
//     ratio (a+b)/(a+c) with Bonett & Price's (2006) interval, net
//     discrimination rates, Newcombe paired difference.
//   unpaired: each probe is one observation; the arm x outcome 2x2 table of
//     R and X gives Fisher's exact test, the conditional MLE and the Woolf
//     sample odds ratio; every arm's rate has a Wilson interval.
//   strata: within each value of each stratum column the same test is run
//     (paired: exact McNemar and conditional OR; unpaired: Fisher); the p
//     values of one column and comparison form one family, adjusted with the
//     design's correction (R's p.adjust).
//   across strata, paired / sets: per stratum column, the homogeneity test
//     of the discordant split b_k / (b_k + c_k) (Pearson's X^2 on the k x 2
//     table of (b_k, c_k), with Fisher–Freeman–Halton's exact p) and the
//     pooled conditional odds ratio sum(b) / sum(c) (stats/homogeneity.h).
//     These keep the pairs: Mantel–Haenszel, CMH and Breslow–Day on arm x
//     outcome tables would count the two probes of a vacancy as independent.
//   across strata, unpaired: the arm x outcome 2x2 table of each value
//     enters the Mantel–Haenszel odds ratio, the CMH test and
//     Breslow–Day/Tarone (probes are independent there).
#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "stats/adjust.h"
#include "stats/equivalence.h"
#include "stats/exact_stratified.h"
#include "stats/fisher.h"
#include "stats/homogeneity.h"
#include "stats/impact.h"
#include "stats/newcombe.h"
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
  // [analysis].equivalence_margin: when > 0, paired comparisons of all sets
  // get the two one-sided tests of |p1 - p2| < margin at level alpha.
  double equivalence_margin = 0;
  double alpha = 0.05;
  // Factors varied between vacancies (paired and sets designs): an arm whose
  // level of one of them differs from the reference arm's never shares a set
  // with it, so it has no comparison with the reference (and does not enter
  // the correction's family); the k-level analysis compares the levels.
  std::vector<std::string> between_factors;
};

// A test of one arm against the reference, on all data or within a stratum.
struct ArmComparison {
  std::string other_label;
  bool paired = true;
  // paired / sets
  stats::PairedCounts pairs;
  stats::McNemarResult mcnemar;
  stats::Estimate conditional_or;         // exact (Clopper–Pearson) interval
  stats::Estimate conditional_or_mid_p;   // the same estimate, mid-p interval
  stats::Estimate callback_ratio;         // (a+b)/(a+c), Bonett–Price interval
  stats::NetDiscrimination net;
  std::optional<stats::EquivalenceResult> equivalence;  // comparisons of all sets, when a margin is set
  // unpaired
  stats::Table2x2 table;  // rows reference / other, columns positive / negative
  stats::FisherResult fisher;
  stats::SampleOddsRatio woolf;
  stats::Interval reference_wilson, other_wilson;
  // The other arm's rate over the reference's (stats/impact.h) and minus it
  // with Newcombe's hybrid score interval (stats/newcombe.h); set when both
  // arms have applications and one is positive.
  bool has_rate_contrast = false;
  stats::ImpactRatio impact;
  stats::RateDifference difference;
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
  bool paired = true;
  int values = 0;  // stratum values
  // paired / sets: the discordant counts per value (value order), their
  // homogeneity test and pooled conditional odds ratio.
  std::vector<stats::DiscordantCounts> discordant;
  stats::DiscordantHomogeneity homogeneity;
  // unpaired: arm x outcome per value (value order), Mantel–Haenszel and
  // Breslow–Day.
  std::vector<stats::Table2x2> tables;
  stats::MantelHaenszelResult mh;
  stats::BreslowDayResult breslow_day;
  // Sparse strata: some table used has an expected count below 5 under
  // independence (Cochran 1954, Biometrics 10:417-451, the rule for
  // chi-square approximations). Then the asymptotic CMH and Breslow–Day
  // are unreliable; the exact conditional test of a common odds ratio (as R's
  // mantelhaen.test(exact = TRUE), stats/exact_stratified.h) is given, and
  // the report warns about Breslow–Day. `exact` is empty when not sparse or
  // too costly.
  bool sparse = false;
  std::optional<stats::ExactStratifiedResult> exact;
};

// A stratum column whose analysed sets all share one value: a stratified
// analysis needs at least two values, so the column gets no per-value rows
// and no test across values, only a sentence (report/fieldwork_state.h).
struct SingleStratum {
  std::string column, value;
};

struct Effects {
  std::string correction;  // the method actually applied ("none" when the design says none)
  std::vector<SingleStratum> single_strata;  // columns left out of the stratified analysis, by column
  std::vector<ArmComparison> comparisons;  // one per non-reference arm, adjusted across arms
  std::vector<StratumComparison> strata;   // per column, comparison and value; adjusted within column x comparison
  std::vector<AcrossStrata> across;        // per column and comparison
  // Arms that never share a set with the reference by design (a factor varied
  // between vacancies), in arm order; they have no comparison above.
  std::vector<std::string> not_with_reference;
};

// Requires arm_labels.size() >= 2 for any comparison (else empty results),
// 0 < confidence < 1. An unknown correction name is treated as "none" and
// reported as such (the design parser rejects unknown names earlier).
Effects ComputeEffects(const EffectsInput& input);

}  // namespace twinprobe
