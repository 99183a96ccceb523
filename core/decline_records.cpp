#include "core/decline_records.h"

#include <cstdlib>

#include "core/meta.h"
#include "core/store.h"

namespace twinprobe {

void InsertDecline(Store& store, const DeclineRow& row) {
  Stmt ins = store.Prepare(
      "INSERT INTO decline(probe_id, declined_at, channel, entered_by, entered_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins.Bind(1, row.probe_id).Bind(2, row.declined_at).Bind(3, row.channel).Bind(4, row.entered_by);
  ins.Bind(5, row.entered_at).Bind(6, row.audit_seq).Run();
}

std::optional<std::string> FirstDeclinedAt(Store& store, int64_t probe_id) {
  Stmt q = store.Prepare("SELECT declined_at FROM decline WHERE probe_id = ?1 ORDER BY id LIMIT 1");
  q.Bind(1, probe_id);
  if (!q.Step()) return std::nullopt;
  return q.Text(0);
}

std::vector<UndeclinedResponse> ReadUndeclinedResponses(Store& store) {
  std::vector<UndeclinedResponse> out;
  Stmt q = store.Prepare(
      "SELECT p.ref, v.ref, v.employer_key, coalesce(pr.display_name, ''), r.code, r.received_at "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id "
      "LEFT JOIN profile pr ON pr.id = p.profile_id "
      "JOIN current_response r ON r.probe_id = p.id "
      "WHERE NOT EXISTS (SELECT 1 FROM decline d WHERE d.probe_id = p.id)");
  while (q.Step()) out.push_back({q.Text(0), q.Text(1), q.Text(2), q.Text(3), q.Text(4), q.Text(5)});
  return out;
}

DeclineReading ReadDeclineFacts(Store& store) {
  DeclineReading out;
  // `plan` stores the design's deadline beside the plan (core/plan_header.cpp).
  if (auto hours = MetaValue(store, "ethics.decline_within_hours")) out.decline_within_hours = std::atoi(hours->c_str());
  Stmt q = store.Prepare(
      "SELECT p.ref, v.ref, r.id, r.code, coalesce(r.received_at, ''), "
      "coalesce((SELECT d.declined_at FROM decline d WHERE d.probe_id = p.id ORDER BY d.id LIMIT 1), '') "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id "
      "JOIN current_response r ON r.probe_id = p.id ORDER BY p.ref");
  while (q.Step()) out.responses.push_back({q.Text(0), q.Text(1), q.Int(2), q.Text(3), q.Text(4), q.Text(5)});
  return out;
}

}  // namespace twinprobe
