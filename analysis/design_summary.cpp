#include "analysis/design_summary.h"

#include "core/factor_signal.h"

#include <set>

namespace twinprobe {

std::string ArmDisplayText(const std::string& arm_label, const std::vector<StoredFactor>& factors) {
  std::string out;
  bool any = false;
  size_t start = 0;
  while (start <= arm_label.size()) {
    const size_t comma = arm_label.find(',', start);
    const std::string part = arm_label.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    const size_t eq = part.find('=');
    std::string shown = eq == std::string::npos ? part : part.substr(eq + 1);
    if (eq != std::string::npos)
      for (const StoredFactor& sf : factors)
        if (sf.name == part.substr(0, eq)) shown = sf.LevelLabel(shown);
    out += (any ? ", " : "") + shown;
    any = true;
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  return out.empty() ? arm_label : out;
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
