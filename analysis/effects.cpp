#include "analysis/effects.h"

#include <algorithm>
#include <map>

#include "analysis/k_level.h"
#include "stats/paired_midp.h"
#include "stats/paired_ratio.h"

namespace twinprobe {
namespace {

ArmComparison Compare(const std::vector<const SetOutcome*>& sets, int other, const EffectsInput& in) {
  ArmComparison c;
  c.other_label = in.arm_labels[static_cast<size_t>(other)];
  c.paired = in.kind != "unpaired";
  if (c.paired) {
    for (const SetOutcome* s : sets) {
      // The first probe of each of the two arms in the set (a set has one per arm).
      int ref = -1, oth = -1;
      for (const auto& [arm, positive] : s->probes) {
        if (arm == 0 && ref < 0) ref = positive;
        if (arm == other && oth < 0) oth = positive;
      }
      if (ref < 0 || oth < 0) continue;
      (ref ? (oth ? c.pairs.a : c.pairs.b) : (oth ? c.pairs.c : c.pairs.d)) += s->count;
    }
    c.mcnemar = stats::McNemar(c.pairs);
    c.conditional_or = stats::ConditionalOddsRatio(c.pairs, in.confidence);
    c.conditional_or_mid_p = stats::ConditionalOddsRatioMidP({c.pairs.b, c.pairs.c}, in.confidence);
    c.callback_ratio = stats::CallbackRatio(c.pairs, in.confidence);
    c.net = stats::NetDiscriminationRates(c.pairs, in.confidence);
    c.p = c.mcnemar.exact;
  } else {
    for (const SetOutcome* s : sets)
      for (const auto& [arm, positive] : s->probes) {
        if (arm == 0) (positive ? c.table.a : c.table.b) += s->count;
        if (arm == other) (positive ? c.table.c : c.table.d) += s->count;
      }
    c.fisher = stats::FisherTest(c.table, stats::Alternative::kTwoSided, in.confidence);
    c.woolf = stats::WoolfOddsRatio(c.table, in.confidence);
    if (c.table.a + c.table.b > 0) c.reference_wilson = stats::Wilson(c.table.a, c.table.a + c.table.b, in.confidence);
    if (c.table.c + c.table.d > 0) c.other_wilson = stats::Wilson(c.table.c, c.table.c + c.table.d, in.confidence);
    c.p = c.fisher.p;
    const int64_t n_ref = c.table.a + c.table.b, n_other = c.table.c + c.table.d;
    if (n_ref > 0 && n_other > 0 && c.table.a + c.table.c > 0) {
      c.has_rate_contrast = true;
      c.impact = stats::ImpactRatioOf(c.table.c, n_other, c.table.a, n_ref, in.confidence);
      c.difference = stats::NewcombeDifference(c.table.c, n_other, c.table.a, n_ref, in.confidence);
    }
  }
  c.p_adjusted = c.p.p;
  return c;
}

// A table that enters the stratified analysis (both rows and both columns
// filled) with an expected count below 5 under independence.
bool HasSparseTable(const std::vector<stats::Table2x2>& tables) {
  for (const stats::Table2x2& t : tables) {
    const double r1 = static_cast<double>(t.a + t.b), r2 = static_cast<double>(t.c + t.d);
    const double c1 = static_cast<double>(t.a + t.c), c2 = static_cast<double>(t.b + t.d);
    const double n = r1 + r2;
    if (r1 == 0 || r2 == 0 || c1 == 0 || c2 == 0) continue;
    if (std::min(r1, r2) * std::min(c1, c2) / n < 5) return true;
  }
  return false;
}

template <typename T>
void Adjust(std::vector<T*>& family, stats::Adjustment method) {
  std::vector<double> p;
  for (T* x : family) p.push_back(x->p.p);
  auto adjusted = stats::AdjustP(p, method);
  for (size_t i = 0; i < family.size(); ++i) family[i]->p_adjusted = adjusted[i];
}

}  // namespace

Effects ComputeEffects(const EffectsInput& in) {
  Effects e;
  auto method = stats::ParseAdjustment(in.correction).value_or(stats::Adjustment::kNone);
  e.correction = stats::AdjustmentName(method);
  if (in.arm_labels.size() < 2) return e;
  std::vector<const SetOutcome*> all;
  for (const auto& s : in.sets) all.push_back(&s);
  const int arms = static_cast<int>(in.arm_labels.size());
  // Arms with a comparison: all but those that never meet the reference.
  std::vector<int> compared;
  for (int other = 1; other < arms; ++other) {
    bool meets = true;
    if (in.kind != "unpaired")
      for (const std::string& factor : in.between_factors)
        meets = meets && LevelOfArm(in.arm_labels[static_cast<size_t>(other)], factor) ==
                             LevelOfArm(in.arm_labels[0], factor);
    if (meets) compared.push_back(other);
    else e.not_with_reference.push_back(in.arm_labels[static_cast<size_t>(other)]);
  }
  for (int other : compared) {
    ArmComparison c = Compare(all, other, in);
    if (c.paired && in.equivalence_margin > 0 && c.pairs.n() > 0)
      c.equivalence = stats::PairedEquivalence(c.pairs, -in.equivalence_margin, in.equivalence_margin, in.alpha);
    e.comparisons.push_back(std::move(c));
  }
  std::vector<ArmComparison*> family;
  for (auto& c : e.comparisons) family.push_back(&c);
  Adjust(family, method);

  // Sets by stratum column and value (std::map: stable, sorted output).
  std::map<std::string, std::map<std::string, std::vector<const SetOutcome*>>> by_column;
  for (const auto& s : in.sets)
    for (const auto& [column, value] : s.strata) by_column[column][value].push_back(&s);
  for (const auto& [column, values] : by_column) {
    if (values.size() < 2) {  // one value: nothing to stratify by
      e.single_strata.push_back({column, values.begin()->first});
      continue;
    }
    for (int other : compared) {
      AcrossStrata across;
      across.column = column;
      across.other_label = in.arm_labels[static_cast<size_t>(other)];
      across.paired = in.kind != "unpaired";
      const size_t first = e.strata.size();
      for (const auto& [value, sets] : values) {
        StratumComparison sc{column, value, Compare(sets, other, in)};
        if (across.paired)
          across.discordant.push_back({sc.result.pairs.b, sc.result.pairs.c});
        else
          across.tables.push_back(sc.result.table);
        e.strata.push_back(std::move(sc));
      }
      std::vector<ArmComparison*> stratum_family;
      for (size_t i = first; i < e.strata.size(); ++i) stratum_family.push_back(&e.strata[i].result);
      Adjust(stratum_family, method);
      across.values = static_cast<int>(values.size());
      if (across.paired) {
        across.homogeneity = stats::TestDiscordantHomogeneity(across.discordant, in.confidence);
      } else {
        across.mh = stats::MantelHaenszel(across.tables, in.confidence);
        across.breslow_day = stats::BreslowDay(across.tables);
        across.sparse = HasSparseTable(across.tables);
        if (across.sparse)
          across.exact = stats::ExactCommonOddsRatio(across.tables, stats::Alternative::kTwoSided, in.confidence);
      }
      e.across.push_back(std::move(across));
    }
  }
  return e;
}

}  // namespace twinprobe
