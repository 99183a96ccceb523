#include "core/plan_probes.h"

namespace twinprobe {

std::vector<PlannedProbeRow> ReadPlannedProbes(Store& store, const std::string& stratum) {
  Stmt q = store.Prepare(
      "SELECT p.id, p.ref, p.planned_at, a.label, "
      "  (SELECT value FROM vacancy_stratum s WHERE s.vacancy_id = p.vacancy_id AND s.name = ?1), "
      "  p.vacancy_id "
      "FROM current_probe p JOIN arm a ON a.id = p.arm_id ORDER BY p.vacancy_id, p.send_order");
  q.Bind(1, stratum);
  std::vector<PlannedProbeRow> out;
  while (q.Step()) out.push_back({q.Int(0), q.Text(1), q.Text(2), q.Text(3), q.Text(4), q.Int(5)});
  return out;
}

PlannedSendingWriter::PlannedSendingWriter(Store& store)
    : insert_(store.Prepare(
          "INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)")) {}

void PlannedSendingWriter::Insert(int64_t seq, int64_t probe_id, const std::string& sent_at,
                                  const std::string& entered_by, const std::string& entered_at) {
  insert_.Bind(1, probe_id).Bind(2, sent_at).Bind(3, entered_by).Bind(4, entered_at).Bind(5, seq).Run();
}

}  // namespace twinprobe
