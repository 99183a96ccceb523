#include "collector/history.h"

#include <algorithm>

#include "core/history_records.h"

namespace twinprobe {
namespace {

int KindRank(const std::string& kind) { return kind == "sending" ? 0 : kind == "response" ? 1 : 2; }

}  // namespace

Result<ProbeHistory> LoadHistory(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref) {
  auto head = ReadProbeHistoryHead(store, probe_ref);
  if (!head)
    return BadInput("", "unknown probe '" + probe_ref + "'",
                    "use a probe reference from 'twinprobe schedule' or the plan (e.g. P00001)");
  ProbeHistory h;
  h.probe = head->probe;
  h.vacancy = head->vacancy;
  h.employer_key = head->employer_key;
  h.arm = head->arm;
  h.profile = head->profile;
  h.planned_at = head->planned_at;
  h.plan_origin = head->plan_origin;
  h.strata = ReadVacancyStrata(store, head->vacancy_id);
  for (const SendingHistoryRow& s : ReadSendingHistory(store, head->probe_id)) {
    HistoryEvent e;
    e.kind = "sending";
    e.id = s.id;
    e.at = s.sent_at;
    e.entered_by = s.entered_by;
    e.entered_at = s.entered_at;
    e.audit_seq = s.audit_seq;
    h.events.push_back(e);
  }
  for (ResponseHistoryRow& r : ReadResponseHistory(store, head->probe_id)) {
    HistoryEvent e;
    e.kind = "response";
    e.id = r.id;
    e.code = std::move(r.code);
    e.at = std::move(r.received_at);
    e.channel = std::move(r.channel);
    e.note = std::move(r.note);
    e.note_purged = r.note_purged;
    e.origin = std::move(r.origin);
    e.flags = std::move(r.flags);
    e.entered_by = std::move(r.entered_by);
    e.entered_at = std::move(r.entered_at);
    e.supersedes = r.supersedes;
    e.audit_seq = r.audit_seq;
    e.superseded_by = r.superseded_by;
    e.positive = scheme.is_positive(e.code);
    h.events.push_back(e);
  }
  for (const DeclineHistoryRow& d : ReadDeclineHistory(store, head->probe_id)) {
    HistoryEvent e;
    e.kind = "decline";
    e.id = d.id;
    e.at = d.declined_at;
    e.channel = d.channel;
    e.entered_by = d.entered_by;
    e.entered_at = d.entered_at;
    e.audit_seq = d.audit_seq;
    h.events.push_back(e);
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
