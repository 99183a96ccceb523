#include "core/probe_layout.h"

#include "core/store.h"

namespace twinprobe {

ProbeLayouts ReadProbeLayout(Store& store) {
  ProbeLayouts out;
  // The same order as the fieldwork's pass (vacancy, then probe id).
  Stmt q = store.Prepare(
      "SELECT p.vacancy_id, p.template, p.send_order FROM probe p "
      "WHERE p.plan_id = (SELECT id FROM current_plan) ORDER BY p.vacancy_id, p.id");
  while (q.Step()) out[q.Int(0)].push_back({q.OptText(1).value_or(""), static_cast<int>(q.Int(2))});
  return out;
}

}  // namespace twinprobe
