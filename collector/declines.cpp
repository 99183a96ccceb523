#include "collector/declines.h"

#include <algorithm>

#include "collector/event_time.h"
#include "collector/responses.h"
#include "collector/time_rules.h"
#include "core/audit.h"
#include "core/ethics_gate.h"
#include "core/audit_summaries.h"
#include "core/clock.h"
#include "core/decline_records.h"
#include "core/response_records.h"
#include "core/sending_records.h"

namespace twinprobe {

std::string PositiveResponseWords(const std::string& code) {
  if (code == "invitation" || code == "offer") return code;
  if (code == "info_request") return "request for information";
  return "'" + code + "' response";
}

std::string DeclineDeadlineWords(const std::string& code, const std::string& probe_ref, int64_t deadline,
                                 int decline_within_hours) {
  return "decline the " + PositiveResponseWords(code) + " to " + probe_ref + " by " + FormatIsoTime(deadline) + " (" +
         DeclineWithinWords(decline_within_hours) + ")";
}

std::string DeclineReminder(const std::string& code, const std::string& probe_ref, int64_t deadline,
                            int decline_within_hours, const std::string& next_step, const std::string& letter) {
  std::string words = DeclineDeadlineWords(code, probe_ref, deadline, decline_within_hours);
  words[0] = 'D';
  return words + " with the letter in " + letter + ", then " + next_step + ".";
}

std::string DeclineKeptSentence(const DeclineRecord& d, int decline_within_hours) {
  if (decline_within_hours <= 0 || d.received_at.empty()) return "";
  const int64_t deadline =
      ParseIsoTime(d.received_at).value_or(0) + static_cast<int64_t>(decline_within_hours) * 3600;
  const int64_t declined = ParseIsoTime(d.declined_at).value_or(0);
  std::string kept = declined <= deadline ? "kept"
                                          : "missed by " + std::to_string((declined - deadline + 3599) / 3600) +
                                                ((declined - deadline + 3599) / 3600 == 1 ? " hour" : " hours");
  return "The deadline was to " + DeclineDeadlineWords(d.code, d.probe_ref, deadline, decline_within_hours) + ": " +
         kept + ".";
}

std::string DeclineSentence(const DeclineRecord& d) {
  if (d.already)
    return "The " + PositiveResponseWords(d.code) + " to " + d.probe_ref + " was already declined at " + d.declined_at +
           "; nothing recorded.";
  return "Recorded that the " + PositiveResponseWords(d.code) + " to " + d.probe_ref + " was declined at " +
         d.declined_at + ".";
}

Result<DeclineRecord> RecordDecline(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref,
                                    const std::string& declined_at, const std::string& channel) {
  AuditedWrite write(store, "decline");
  int64_t probe_id = FindProbe(store, probe_ref);
  if (probe_id == 0)
    return BadInput("", "unknown probe '" + probe_ref + "'", "use a probe reference from 'twinprobe schedule'");
  std::string at = declined_at.empty() ? write.at() : declined_at;
  auto t = ParseEventTime(at);
  if (!t)
    return BadInput("", "'" + at + "' " + WhyNotATime(at, "is not a time"),
                    "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC, or with an offset such as +01:00)");
  std::optional<std::string> code = CurrentResponseCode(store, probe_id);
  if (!code)
    return BadInput("", "probe '" + probe_ref + "' has no response recorded, so there is nothing to decline",
                    "record the employer's response first with 'twinprobe record'");
  std::optional<std::string> received_at = CurrentResponseReceivedAt(store, probe_id);
  if (!scheme.is_positive(*code)) {
    std::string positive;
    for (const auto& c : scheme.codes)
      if (scheme.is_positive(c)) positive += (positive.empty() ? "" : ", ") + c;
    return BadInput("", "the current response to " + probe_ref + " is '" + *code + "'" +
                            (received_at ? " (received " + *received_at + ")" : "") + ", which needs no decline",
                    "only a positive response (" + positive +
                        ") is declined; if the employer answered again, record that first with 'twinprobe record'");
  }
  DeclineRecord out{probe_ref, *code, t->text(), false, received_at.value_or("")};
  if (auto first = FirstDeclinedAt(store, probe_id)) {
    out.declined_at = *first;
    out.already = true;
    return out;  // nothing written; the transaction rolls back
  }
  // A decline answers a response that has arrived (the plausible-time rules,
  // collector/time_rules.h, compare by day when either time is a date alone).
  TimeRules rules;
  rules.now = ParseIsoTime(write.at()).value_or(NowEpoch());
  std::optional<EventTime> received;
  if (received_at) received = ParseEventTime(*received_at);
  if (Status plausible = CheckPlausibleTime(
          rules, TimedFact{TimedEvent::kDecline, probe_ref, *t, received, PositiveResponseWords(*code)}, "");
      !plausible.ok())
    return plausible.error();
  DeclineRow row{probe_id, out.declined_at, std::nullopt, write.actor(), write.at(), write.seq()};
  if (!channel.empty()) row.channel = channel;
  InsertDecline(store, row);
  write.Commit(DeclineSummary(probe_ref, out.declined_at));
  return out;
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
