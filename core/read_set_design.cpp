#include "core/read_set_design.h"

#include <set>

#include "core/store.h"
#include "core/stored_codes.h"

namespace twinprobe {

std::vector<PlannedSetDesign> ReadSetDesigns(Store& store) {
  std::vector<PlannedSetDesign> sets;
  Stmt plan = store.Prepare("SELECT id FROM current_plan");
  if (!plan.Step()) return sets;
  const int64_t plan_id = plan.Int(0);

  std::set<std::string> between;
  Stmt b = store.Prepare(
      "SELECT f.name FROM factor f JOIN factor_design fd ON fd.factor_id = f.id WHERE f.plan_id = ?1 AND fd.vary = ?2");
  b.Bind(1, plan_id).Bind(2, FactorVaryName(FactorVary::kBetween));
  while (b.Step()) between.insert(b.Text(0));

  std::map<int64_t, std::map<std::string, std::string>> arm_levels;
  Stmt al = store.Prepare(
      "SELECT al.arm_id, f.name, l.name FROM arm_level al JOIN level l ON l.id = al.level_id "
      "JOIN factor f ON f.id = l.factor_id WHERE f.plan_id = ?1");
  al.Bind(1, plan_id);
  while (al.Step()) arm_levels[al.Int(0)][al.Text(1)] = al.Text(2);

  Stmt p = store.Prepare(
      "SELECT v.id, v.ref, p.id, p.ref, p.arm_id, a.label, p.template, p.send_order FROM current_probe p "
      "JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id ORDER BY v.id, p.send_order, p.id");
  while (p.Step()) {
    if (sets.empty() || sets.back().vacancy_id != p.Int(0)) {
      PlannedSetDesign s;
      s.vacancy_id = p.Int(0);
      s.vacancy_ref = p.Text(1);
      sets.push_back(std::move(s));
    }
    SetProbeDesign probe;
    probe.probe_id = p.Int(2);
    probe.probe_ref = p.Text(3);
    probe.arm_id = p.Int(4);
    probe.arm_label = p.Text(5);
    probe.levels = arm_levels[probe.arm_id];
    probe.template_path = p.OptText(6).value_or("");
    probe.send_order = static_cast<int>(p.Int(7));
    if (sets.back().probes.empty())
      for (const auto& [factor, level] : probe.levels)
        if (between.count(factor)) sets.back().between[factor] = level;
    sets.back().probes.push_back(std::move(probe));
  }
  return sets;
}

}  // namespace twinprobe
