#include "collector/declines.h"

#include <algorithm>

#include "collector/responses.h"
#include "core/audit.h"
#include "core/clock.h"
#include "core/decline_records.h"
#include "core/response_records.h"

namespace twinprobe {

Result<std::string> RecordDecline(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref,
                                  const std::string& declined_at, const std::string& channel) {
  AuditedWrite write(store, "decline");
  int64_t probe_id = FindProbe(store, probe_ref);
  if (probe_id == 0)
    return BadInput("", "unknown probe '" + probe_ref + "'", "use a probe reference from 'twinprobe schedule'");
  std::optional<std::string> code = CurrentResponseCode(store, probe_id);
  if (!code || !scheme.is_positive(*code))
    return BadInput("", "probe '" + probe_ref + "' has no invitation or offer to decline",
                    "record the employer's response first with 'twinprobe record'");
  std::string at = declined_at.empty() ? write.at() : declined_at;
  auto t = ParseIsoTime(at);
  if (!t) return BadInput("", "'" + at + "' is not a time", "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM");
  at = FormatIsoTime(*t);
  DeclineRow row{probe_id, at, std::nullopt, write.actor(), write.at(), write.seq()};
  if (!channel.empty()) row.channel = channel;
  InsertDecline(store, row);
  write.Commit("decline " + probe_ref + " at " + at);
  return at;
}

std::vector<PendingDecline> PendingDeclines(Store& store, const OutcomeScheme& scheme, int decline_within_hours,
                                            int64_t now) {
  std::vector<PendingDecline> out;
  for (UndeclinedResponse& r : ReadUndeclinedResponses(store)) {
    if (!scheme.is_positive(r.code)) continue;
    PendingDecline d{std::move(r.probe_ref), std::move(r.vacancy_ref), std::move(r.employer_key),
                     std::move(r.profile), std::move(r.code), std::move(r.received_at), 0, false};
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
