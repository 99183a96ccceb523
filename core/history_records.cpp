#include "core/history_records.h"

#include "core/store.h"

namespace twinprobe {
namespace {

bool HasTable(Store& store, const std::string& name) {
  Stmt s = store.Prepare("SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = ?1");
  s.Bind(1, name);
  return s.Step() && s.Int(0) > 0;
}

}  // namespace

std::optional<ProbeHistoryHead> ReadProbeHistoryHead(Store& store, const std::string& ref) {
  Stmt p = store.Prepare(
      "SELECT p.id, p.ref, v.ref, v.employer_key, a.label, pr.display_name, p.planned_at, pl.origin, v.id "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "JOIN plan pl ON pl.id = p.plan_id LEFT JOIN profile pr ON pr.id = p.profile_id WHERE p.ref = ?1");
  p.Bind(1, ref);
  if (!p.Step()) return std::nullopt;
  ProbeHistoryHead h;
  h.probe_id = p.Int(0);
  h.probe = p.Text(1);
  h.vacancy = p.Text(2);
  h.employer_key = p.Text(3);
  h.arm = p.Text(4);
  h.profile = p.Text(5);
  h.planned_at = p.Text(6);
  h.plan_origin = p.Text(7);
  h.vacancy_id = p.Int(8);
  return h;
}

std::vector<std::pair<std::string, std::string>> ReadVacancyStrata(Store& store, int64_t vacancy_id) {
  std::vector<std::pair<std::string, std::string>> out;
  Stmt st = store.Prepare("SELECT name, value FROM vacancy_stratum WHERE vacancy_id = ?1 ORDER BY rowid");
  st.Bind(1, vacancy_id);
  while (st.Step()) out.emplace_back(st.Text(0), st.Text(1));
  return out;
}

std::vector<SendingHistoryRow> ReadSendingHistory(Store& store, int64_t probe_id) {
  std::vector<SendingHistoryRow> out;
  Stmt s = store.Prepare("SELECT id, sent_at, entered_by, entered_at, audit_seq FROM sending WHERE probe_id = ?1");
  s.Bind(1, probe_id);
  while (s.Step()) out.push_back({s.Int(0), s.Int(4), s.Text(1), s.Text(2), s.Text(3)});
  return out;
}

std::vector<ResponseHistoryRow> ReadResponseHistory(Store& store, int64_t probe_id) {
  std::vector<ResponseHistoryRow> out;
  Stmt r = store.Prepare(
      "SELECT r.id, r.code, r.received_at, r.channel, r.note, r.note_sha256, r.origin, r.flags, r.entered_by, "
      "r.entered_at, r.supersedes, r.audit_seq, (SELECT min(n.id) FROM response n WHERE n.supersedes = r.id) "
      "FROM response r WHERE r.probe_id = ?1");
  r.Bind(1, probe_id);
  while (r.Step()) {
    ResponseHistoryRow e;
    e.id = r.Int(0);
    e.code = r.Text(1);
    e.received_at = r.Text(2);
    e.channel = r.Text(3);
    e.note = r.Text(4);
    e.note_purged = r.IsNull(4) && !r.IsNull(5);
    e.origin = r.Text(6);
    e.flags = r.Text(7);
    e.entered_by = r.Text(8);
    e.entered_at = r.Text(9);
    e.supersedes = r.IsNull(10) ? 0 : r.Int(10);
    e.audit_seq = r.Int(11);
    e.superseded_by = r.IsNull(12) ? 0 : r.Int(12);
    out.push_back(std::move(e));
  }
  return out;
}

std::vector<DeclineHistoryRow> ReadDeclineHistory(Store& store, int64_t probe_id) {
  std::vector<DeclineHistoryRow> out;
  if (!HasTable(store, "decline")) return out;
  Stmt d = store.Prepare("SELECT id, declined_at, channel, entered_by, entered_at, audit_seq FROM decline WHERE probe_id = ?1");
  d.Bind(1, probe_id);
  while (d.Step()) out.push_back({d.Int(0), d.Int(5), d.Text(1), d.Text(2), d.Text(3), d.Text(4)});
  return out;
}

}  // namespace twinprobe
