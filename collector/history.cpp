#include "collector/history.h"

#include <algorithm>

namespace twinprobe {
namespace {

int KindRank(const std::string& kind) { return kind == "sending" ? 0 : kind == "response" ? 1 : 2; }

bool HasTable(Store& store, const std::string& name) {
  Stmt s = store.Prepare("SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = ?1");
  s.Bind(1, name);
  return s.Step() && s.Int(0) > 0;
}

}  // namespace

Result<ProbeHistory> LoadHistory(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref) {
  Stmt p = store.Prepare(
      "SELECT p.id, p.ref, v.ref, v.employer_key, a.label, pr.display_name, p.planned_at, pl.origin, v.id "
      "FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "JOIN plan pl ON pl.id = p.plan_id LEFT JOIN profile pr ON pr.id = p.profile_id WHERE p.ref = ?1");
  p.Bind(1, probe_ref);
  if (!p.Step())
    return BadInput("", "unknown probe '" + probe_ref + "'",
                    "use a probe reference from 'twinprobe schedule' or the plan (e.g. P00001)");
  ProbeHistory h;
  const int64_t probe_id = p.Int(0);
  h.probe = p.Text(1);
  h.vacancy = p.Text(2);
  h.employer_key = p.Text(3);
  h.arm = p.Text(4);
  h.profile = p.Text(5);
  h.planned_at = p.Text(6);
  h.plan_origin = p.Text(7);
  Stmt st = store.Prepare("SELECT name, value FROM vacancy_stratum WHERE vacancy_id = ?1 ORDER BY rowid");
  st.Bind(1, p.Int(8));
  while (st.Step()) h.strata.emplace_back(st.Text(0), st.Text(1));

  Stmt s = store.Prepare("SELECT id, sent_at, entered_by, entered_at, audit_seq FROM sending WHERE probe_id = ?1");
  s.Bind(1, probe_id);
  while (s.Step()) {
    HistoryEvent e;
    e.kind = "sending";
    e.id = s.Int(0);
    e.at = s.Text(1);
    e.entered_by = s.Text(2);
    e.entered_at = s.Text(3);
    e.audit_seq = s.Int(4);
    h.events.push_back(e);
  }
  Stmt r = store.Prepare(
      "SELECT r.id, r.code, r.received_at, r.channel, r.note, r.note_sha256, r.origin, r.flags, r.entered_by, "
      "r.entered_at, r.supersedes, r.audit_seq, (SELECT min(n.id) FROM response n WHERE n.supersedes = r.id) "
      "FROM response r WHERE r.probe_id = ?1");
  r.Bind(1, probe_id);
  while (r.Step()) {
    HistoryEvent e;
    e.kind = "response";
    e.id = r.Int(0);
    e.code = r.Text(1);
    e.at = r.Text(2);
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
    e.positive = scheme.is_positive(e.code);
    h.events.push_back(e);
  }
  if (HasTable(store, "decline")) {
    Stmt d = store.Prepare(
        "SELECT id, declined_at, channel, entered_by, entered_at, audit_seq FROM decline WHERE probe_id = ?1");
    d.Bind(1, probe_id);
    while (d.Step()) {
      HistoryEvent e;
      e.kind = "decline";
      e.id = d.Int(0);
      e.at = d.Text(1);
      e.channel = d.Text(2);
      e.entered_by = d.Text(3);
      e.entered_at = d.Text(4);
      e.audit_seq = d.Int(5);
      h.events.push_back(e);
    }
  }
  std::sort(h.events.begin(), h.events.end(), [](const HistoryEvent& a, const HistoryEvent& b) {
    if (a.audit_seq != b.audit_seq) return a.audit_seq < b.audit_seq;
    if (a.kind != b.kind) return KindRank(a.kind) < KindRank(b.kind);
    return a.id < b.id;
  });
  // The current response is the newest one nothing supersedes (as in the
  // current_response view, newest first when there are several).
  for (size_t i = 0; i < h.events.size(); ++i) {
    const HistoryEvent& e = h.events[i];
    if (e.kind != "response" || e.superseded_by != 0) continue;
    if (h.current_response < 0 || e.id > h.events[static_cast<size_t>(h.current_response)].id)
      h.current_response = static_cast<int>(i);
  }
  if (h.current_response >= 0) h.events[static_cast<size_t>(h.current_response)].current = true;
  return h;
}

}  // namespace twinprobe
