#include "core/schedule_rows.h"

namespace twinprobe {

std::vector<ScheduledProbe> ReadScheduleRows(Store& store) {
  Stmt q = store.Prepare(
      "SELECT p.ref, v.ref, coalesce(v.employer_key, ''), a.label, coalesce(pr.display_name, ''), "
      "  coalesce(pr.mailbox, ''), coalesce(pr.phone, ''), coalesce(p.template, ''), p.send_order, "
      "  coalesce(p.planned_at, ''), "
      "  coalesce((SELECT s.sent_at FROM sending s WHERE s.probe_id = p.id ORDER BY s.id DESC LIMIT 1), '') "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "LEFT JOIN profile pr ON pr.id = p.profile_id "
      // A withdrawn vacancy's unsent probes are not to be sent (core/withdrawal_records.h).
      "WHERE NOT EXISTS (SELECT 1 FROM withdrawal w WHERE w.vacancy_id = p.vacancy_id) "
      "   OR EXISTS (SELECT 1 FROM sending s WHERE s.probe_id = p.id) "
      "ORDER BY p.planned_at, p.ref");
  std::vector<ScheduledProbe> out;
  while (q.Step())
    out.push_back({q.Text(0), q.Text(1), q.Text(2), q.Text(3), q.Text(4), q.Text(5), q.Text(6), q.Text(7),
                   static_cast<int>(q.Int(8)), q.Text(9), q.Text(10)});
  return out;
}

}  // namespace twinprobe
