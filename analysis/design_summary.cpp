#include "analysis/design_summary.h"

#include "core/factor_signal.h"
#include "core/level_labels.h"

#include <set>

namespace twinprobe {

std::string ArmDisplayText(const std::string& arm_label, const std::vector<StoredFactor>& factors) {
  std::map<std::string, LevelLabels> by_factor;
  for (const StoredFactor& sf : factors) by_factor.emplace(sf.name, LevelLabelsOf(sf.levels, sf.level_labels));
  return ArmDisplay(arm_label, by_factor);
}

DesignSummary SummariseDesign(const Fieldwork& f, const StoredDesign& stored) {
  DesignSummary d;
  if (!f.has_plan) return d;
  d.design_sha256 = f.design_sha256;
  // Records were never randomised: the seed an import stores is no seed.
  d.has_seed = f.seed.has_value() && !stored.records;
  d.seed = f.seed.value_or(0);
  d.plan_created_at = f.plan_created_at;
  if (stored.has_window) d.window_days = stored.scheme.window_days;
  d.strata_columns = stored.strata_columns;
  for (const auto& sf : stored.factors)
    d.factors.push_back({sf.name, sf.levels, sf.reference, DescribeSignal(sf.signal), sf.between, sf.label,
                         sf.level_labels});
  for (const auto& a : f.arms) {
    auto it = stored.profiles_by_arm.find(a.id);
    d.arms.push_back({a.label, a.is_reference, it == stored.profiles_by_arm.end() ? 0 : it->second, a.probes_planned});
  }
  for (const auto& s : f.vacancies_by_stratum) d.strata.push_back({s.name, s.value, s.vacancies});
  std::set<std::string> templates;
  for (const auto& [cell, n] : f.balance.templates) templates.insert(cell.second);
  d.templates.assign(templates.begin(), templates.end());
  d.employers = stored.employers;
  d.first_sent_at = f.first_sent_at;
  d.last_sent_at = f.last_sent_at;
  for (const auto& a : f.arms) d.arm_display[a.label] = ArmDisplayText(a.label, stored.factors);
  d.imported_files = stored.imported_files;
  return d;
}

}  // namespace twinprobe
