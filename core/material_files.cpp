#include "core/material_files.h"

namespace twinprobe {

std::optional<int64_t> CurrentPlanId(Store& store) {
  Stmt q = store.Prepare("SELECT max(id) FROM plan");
  if (!q.Step() || q.IsNull(0)) return std::nullopt;
  return q.Int(0);
}

void WriteMaterialFiles(Store& store, int64_t seq, const std::vector<MaterialFileInsert>& rows) {
  Stmt probe = store.Prepare("SELECT id, plan_id FROM current_probe WHERE ref = ?1");
  Stmt ins = store.Prepare(
      "INSERT INTO material_file(plan_id, probe_id, folder, file, sha256, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  for (const auto& r : rows) {
    probe.Reset();
    probe.Bind(1, r.probe_ref);
    if (!probe.Step()) throw StoreError("render: probe " + r.probe_ref + " is not in the current plan");
    const int64_t probe_id = probe.Int(0), plan_id = probe.Int(1);
    ins.Reset();
    ins.Bind(1, plan_id).Bind(2, probe_id).Bind(3, r.folder).Bind(4, r.file).Bind(5, r.sha256).Bind(6, seq).Run();
  }
}

ProbeMaterialFiles ReadProbeMaterialFiles(Store& store, const std::string& probe_ref) {
  ProbeMaterialFiles out;
  Stmt known = store.Prepare("SELECT 1 FROM current_probe WHERE ref = ?1");
  known.Bind(1, probe_ref);
  out.probe_known = known.Step();
  Stmt last = store.Prepare("SELECT max(plan_id) FROM material_file");
  if (last.Step() && !last.IsNull(0)) out.last_rendered_plan = last.Int(0);
  if (!out.last_rendered_plan) return out;
  // The newest row per file name: a later render of the probe replaces an earlier one.
  Stmt q = store.Prepare(
      "SELECT m.folder, m.file, m.sha256 FROM material_file m JOIN current_probe p ON p.id = m.probe_id "
      "WHERE p.ref = ?1 AND m.id = (SELECT max(n.id) FROM material_file n WHERE n.probe_id = m.probe_id "
      "AND n.file = m.file) ORDER BY m.file");
  q.Bind(1, probe_ref);
  while (q.Step()) out.files.push_back({q.Text(0), q.Text(1), q.Text(2)});
  return out;
}

}  // namespace twinprobe
