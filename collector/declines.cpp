#include "collector/declines.h"

#include <algorithm>

#include "collector/responses.h"
#include "core/audit.h"
#include "core/clock.h"

namespace twinprobe {

Result<std::string> RecordDecline(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref,
                                  const std::string& declined_at, const std::string& channel) {
  AuditedWrite write(store, "decline");
  int64_t probe_id = FindProbe(store, probe_ref);
  if (probe_id == 0)
    return BadInput("", "unknown probe '" + probe_ref + "'", "use a probe reference from 'twinprobe schedule'");
  Stmt cur = store.Prepare("SELECT code FROM current_response WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1");
  cur.Bind(1, probe_id);
  if (!cur.Step() || !scheme.is_positive(cur.Text(0)))
    return BadInput("", "probe '" + probe_ref + "' has no invitation or offer to decline",
                    "record the employer's response first with 'twinprobe record'");
  std::string at = declined_at.empty() ? write.at() : declined_at;
  auto t = ParseIsoTime(at);
  if (!t) return BadInput("", "'" + at + "' is not a time", "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM");
  at = FormatIsoTime(*t);
  Stmt ins = store.Prepare(
      "INSERT INTO decline(probe_id, declined_at, channel, entered_by, entered_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins.Bind(1, probe_id).Bind(2, at);
  if (channel.empty()) ins.BindNull(3);
  else ins.Bind(3, channel);
  ins.Bind(4, write.actor()).Bind(5, write.at()).Bind(6, write.seq()).Run();
  write.Commit("decline " + probe_ref + " at " + at);
  return at;
}

std::vector<PendingDecline> PendingDeclines(Store& store, const OutcomeScheme& scheme, int decline_within_hours,
                                            int64_t now) {
  std::vector<PendingDecline> out;
  Stmt q = store.Prepare(
      "SELECT p.ref, v.ref, v.employer_key, coalesce(pr.display_name, ''), r.code, r.received_at "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id "
      "LEFT JOIN profile pr ON pr.id = p.profile_id "
      "JOIN current_response r ON r.probe_id = p.id "
      "WHERE NOT EXISTS (SELECT 1 FROM decline d WHERE d.probe_id = p.id)");
  while (q.Step()) {
    if (!scheme.is_positive(q.Text(4))) continue;
    PendingDecline d{q.Text(0), q.Text(1), q.Text(2), q.Text(3), q.Text(4), q.Text(5), 0, false};
    d.deadline = ParseIsoTime(d.received_at).value_or(0) + static_cast<int64_t>(decline_within_hours) * 3600;
    d.overdue = d.deadline < now;
    out.push_back(std::move(d));
  }
  std::sort(out.begin(), out.end(), [](const PendingDecline& a, const PendingDecline& b) {
    return a.deadline != b.deadline ? a.deadline < b.deadline : a.probe_ref < b.probe_ref;
  });
  return out;
}

}  // namespace twinprobe
