#pragma once
// Analyses for designs beyond one two-level factor: a factor with k >= 3
// levels, or two factors. Pure: takes the complete sets as plain values
// (analysis/analyze.cpp builds them from core/fieldwork.h).
//
// Per factor (docs/methods.md, "Several levels and two factors"):
//   varied within sets (each analysed set holds one probe of every level):
//     overall test of equal positive rates: Cochran's Q (Cochran 1950,
//     on blocks of one probe per level: the sets, or with a second factor
//     varied within sets each set's probes at one level of it;
//     Biometrika 37:256-266; stats/cochran_q.h) with its exact permutation
//     p when feasible; every pair of levels by the exact McNemar test on the
//     sets' paired table, adjusted with the design's correction over all
//     k (k - 1) / 2 pairs (stats/pairwise.h), with net discrimination and
//     the conditional odds ratio of each pair; with `scores`, the trend is
//     the slope of a conditional logistic regression on the score
//     (survival::clogit(y ~ score + strata(set)); stats/clogit.h).
//   varied between vacancies, or an unpaired design: the k x 2 table of
//     probes: Pearson's chi-square and the Freeman–Halton exact test
//     (stats/k_by_two.h), pairs of levels by Fisher's exact test, and with
//     `scores` the Cochran–Armitage trend test (stats/trend.h). These count
//     probes as independent, which the probes of one vacancy are not: in a
//     paired or sets design the factor is tested by re-assigning its levels
//     to the vacancies within the plan's blocks (analysis/vacancy_test.h),
//     and the k x 2 tests stay as a description.
// Two factors (matched sets only): a conditional logistic regression with
// indicators of each factor's non-reference levels and their products
// (interaction). Main effects and the interaction are tested by likelihood
// ratios of nested models (Breslow & Day 1980, vol. 1, ch. 7); a factor
// varied between vacancies is constant within every set, so its main
// effect cancels from the conditional likelihood and is reported as not
// estimable (its interaction with a within factor is estimable).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "analysis/effects.h"
#include "analysis/vacancy_test.h"
#include "stats/clogit.h"
#include "stats/paired.h"

namespace twinprobe {

// A factor as the analysis needs it. `scores` (one per level, in `levels`
// order) mark ordered levels; empty when the design declares none.
struct KLevelFactor {
  std::string name;
  std::vector<std::string> levels;
  std::string reference;
  std::vector<double> scores;
  // Display texts (StoredFactor::DisplayName / LevelLabel): the factor's,
  // and one per level in `levels` order. Empty: the name and the levels.
  std::string label;
  std::vector<std::string> level_labels;
};

struct KLevelInput {
  std::string kind = "sets";            // paired | sets | unpaired
  std::vector<std::string> arm_labels;  // "age=28" or "age=28,gender=f"; [0] is the reference arm
  std::vector<SetOutcome> sets;         // complete sets only
  // The design's factors; empty: the arms are the levels of one factor "arm".
  std::vector<KLevelFactor> factors;
  std::string correction = "holm";
  double confidence = 0.95;
  uint64_t seed = 0;  // the design's seed: the vacancy permutation test's resamples
};

struct LevelRate {
  std::string level;
  std::string label;  // display text of the level (the level when it has none)
  int64_t probes = 0;
  int64_t positive = 0;
  double rate = 0;
};

struct OverallTest {
  std::string method;  // "cochran_q" (within) | "chi_square" (k x 2 table)
  int64_t sets = 0;              // cochran_q: blocks used (sets, or sets x levels of `blocks_by`)
  int64_t informative_sets = 0;  // cochran_q: blocks with a positive and a negative
  // cochran_q with another factor varied within sets: its display text; the
  // blocks are then (set, level of that factor), each holding one probe of
  // every level of this factor. "" when the blocks are the sets.
  std::string blocks_by;
  double statistic = 0;          // Q or X^2
  int df = 0;
  double p_asymptotic = 1;
  std::optional<double> p_exact;  // permutation (Q) or Freeman–Halton (k x 2), when feasible
  double min_expected = 0;        // chi_square: the smallest expected count
  // The headline p: the exact one when there is one.
  double p() const { return p_exact.value_or(p_asymptotic); }
};

struct LevelPair {
  std::string first, second;  // levels in declared order
  std::string first_label, second_label;  // their display texts
  double rate_first = 0, rate_second = 0, difference = 0;
  bool paired = true;
  stats::PairedCounts pairs;        // paired: the sets' table (a both, b first only, c second only, d neither)
  stats::NetDiscrimination net;     // paired: (b - c) / (a + b + c) and (b - c) / n
  stats::Estimate conditional_or;   // paired: b / c, exact interval
  double p = 1;                     // exact McNemar (paired) or Fisher (unpaired), two-sided
  double p_adjusted = 1;
};

struct TrendResult {
  bool present = false;    // the factor has scores
  bool defined = false;    // false when every outcome or score is the same, or the fit failed
  std::string method;      // "cochran_armitage" | "clogit_slope"
  std::vector<double> scores;
  double statistic = 0;    // X^2 (Cochran–Armitage) or likelihood-ratio chi-square (clogit), 1 df
  double p = 1;
  double z = 0;            // cochran_armitage: signed root
  double slope = 0;        // clogit_slope: log odds ratio per score unit
  double odds_ratio = 1;   // clogit_slope: exp(slope)
  stats::Interval ci;      // clogit_slope: profile interval of the odds ratio per unit
  std::string note;        // why it is not defined
};

struct FactorAnalysis {
  std::string name;
  std::string label;   // display text of the factor (its name when it has none)
  bool within = true;  // some set holds two of its levels
  std::vector<LevelRate> levels;
  std::optional<OverallTest> overall;  // between: the k x 2 table, descriptive (probes of a vacancy are not independent)
  std::vector<LevelPair> pairwise;  // (0,1), (0,2), ..., (1,2), ...
  TrendResult trend;
  // Varied between vacancies in a paired or sets design: the test of the
  // factor, at the level of its randomisation (analysis/vacancy_test.h).
  VacancyPermutationTest vacancy_test;
};

struct ModelTerm {
  std::string name;  // "age=45", "age=45 x gender=m"
  std::string label;  // with display texts: "aged 45", "aged 45 x man"
  double coefficient = 0, standard_error = 0, odds_ratio = 1, p_wald = 1;
  stats::Interval ci;  // profile interval of the odds ratio
};

struct EffectTest {
  std::string name;  // "age", "gender", "age x gender"
  std::string label;  // with display texts: "age (years) x gender"
  bool estimable = true;
  std::string note;  // why not estimable
  double statistic = 0;
  int df = 0;
  double p = 1;
};

struct TwoFactorModel {
  bool present = false;
  std::string failure;  // the fit's message when it failed ("" when it ran)
  int sets = 0;         // informative sets
  std::vector<ModelTerm> terms;   // main effects (main-effects model), then interaction (full model)
  std::vector<EffectTest> tests;  // each factor's main effect, then the interaction
};

struct KLevelAnalysis {
  bool present = false;  // a factor with 3 or more levels, or two factors
  std::vector<FactorAnalysis> factors;
  TwoFactorModel model;
};

// Requires 0 < confidence < 1 and arm labels naming every factor's level
// (arms whose label does not are left out). Returns present = false for a
// design of one two-level factor (analysis/effects.h covers it).
KLevelAnalysis AnalyzeKLevels(const KLevelInput& input);

// "age=28,gender=f" -> the level of `factor` ("28"), "" when absent. A label
// without '=' is the level of a study's single factor, whatever its name
// (imported records name their arms by level).
std::string LevelOfArm(const std::string& label, const std::string& factor);

}  // namespace twinprobe
