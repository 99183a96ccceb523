#include "core/material_rows.h"

namespace twinprobe {

std::vector<MaterialRow> ReadMaterialRows(Store& store) {
  Stmt q = store.Prepare(
      "SELECT p.ref, v.ref, a.label, p.send_order, p.planned_at, p.template, pr.fields "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "LEFT JOIN profile pr ON pr.id = p.profile_id ORDER BY p.vacancy_id, p.send_order, p.id");
  std::vector<MaterialRow> out;
  while (q.Step())
    out.push_back({q.Text(0), q.Text(1), q.Text(2), static_cast<int>(q.Int(3)), q.Text(4), q.Text(5), q.OptText(6)});
  return out;
}

}  // namespace twinprobe
