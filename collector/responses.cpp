#include "collector/responses.h"

#include <algorithm>

#include "collector/event_time.h"
#include "collector/time_rules.h"
#include "core/audit.h"
#include "core/audit_summaries.h"
#include "core/clock.h"
#include "core/echoed_value.h"
#include "core/response_records.h"
#include "core/sending_records.h"
#include "core/suggest.h"
#include "core/withdrawal_records.h"

namespace twinprobe {
namespace {

std::string JoinCodes(const std::vector<std::string>& codes) {
  std::string s;
  for (const auto& c : codes) s += (s.empty() ? "" : ", ") + c;
  return s;
}

constexpr const char* kTimeFormat = "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)";

}  // namespace

const std::vector<std::string>& ResponseChannels() {
  static const std::vector<std::string> channels = {"mail", "phone", "letter", "other"};
  return channels;
}

int64_t FindProbe(Store& store, const std::string& probe_ref) { return FindCurrentProbe(store, probe_ref); }

Error NoSendingError(const std::string& where, const std::string& probe_ref) {
  return BadInput(where, probe_ref + " has no sending recorded, so no response to it can have come",
                  "record the sending first with 'twinprobe sent " + probe_ref +
                      " --at TIME' (or 'twinprobe import sendings FILE.csv' for many)");
}

ResponseWriter::ResponseWriter(Store& store, const OutcomeScheme& scheme, int64_t seq, std::string actor,
                               std::string at, ResponseRules rules)
    : scheme_(scheme),
      rules_(rules),
      seq_(seq),
      actor_(std::move(actor)),
      at_(std::move(at)),
      records_(std::make_unique<ResponseRecords>(store)) {}

ResponseWriter::~ResponseWriter() = default;

Result<RecordedResponse> ResponseWriter::Add(const ResponseEntry& e, const std::string& where,
                                             const TimeReading& time) {
  int64_t probe_id = records_->FindProbe(e.probe_ref);
  if (probe_id == 0)
    return BadInput(where, "unknown probe '" + Echoed(e.probe_ref) + "'",
                    "use a probe reference from 'twinprobe schedule' or the plan (e.g. P00001)");
  if (!scheme_.has_code(e.code))
    return BadInput(where, "'" + Echoed(e.code) + "' is not a response code of this study" + DidYouMean(e.code, scheme_.codes),
                    "use one of: " + JoinCodes(scheme_.codes));
  const auto& channels = ResponseChannels();
  if (!e.channel.empty() && std::find(channels.begin(), channels.end(), e.channel) == channels.end())
    return BadInput(where, "unknown channel '" + Echoed(e.channel) + "'" + DidYouMean(e.channel, channels),
                    "use mail, phone, letter or other");

  RecordedResponse out;
  out.probe_ref = e.probe_ref;
  out.code = e.code;
  out.positive = scheme_.is_positive(e.code);
  std::optional<EventTime> received;
  if (!time.unknown) {
    std::string text = e.received_at.empty() ? at_ : e.received_at;
    received = ParseEventTime(text);
    if (!received)
      return BadInput(where, (time.label.empty() ? "" : time.label + " ") + "'" + Echoed(text) + "' " + WhyNotATime(text, "is not a date or time"),
                      kTimeFormat);
    out.received_at = received->text();
  }

  // A response answers an application: with no sending on record, the
  // window and the plausible-time rule have nothing to measure from, and the
  // schedule would list the probe both to send and to decline (issue 17).
  out.sent_at = records_->LastSentAt(probe_id);
  if (out.sent_at.empty()) return NoSendingError(where, e.probe_ref);
  std::optional<EventTime> sent = ParseEventTime(out.sent_at);
  if (received) {
    TimeRules clock;
    clock.now = rules_.now ? *rules_.now : ParseIsoTime(at_).value_or(0);
    TimedFact fact{TimedEvent::kResponse, e.probe_ref, *received, sent, ""};
    if (Status plausible = CheckPlausibleTime(clock, fact, where); !plausible.ok()) return plausible.error();
    if (sent) {
      out.late = IsAfterWindow(*sent, *received, scheme_.window_days);
      out.days_after_sending = DaysBetween(*sent, *received);
    }
  }

  out.superseded = records_->CurrentResponseId(probe_id);

  ResponseRow row;
  row.probe_id = probe_id;
  row.code = e.code;
  if (received) row.received_at = out.received_at;
  if (!e.channel.empty()) row.channel = e.channel;
  if (!e.note.empty()) row.note = e.note;
  row.origin = e.origin;
  row.flags = out.late ? "late" : "";
  row.entered_by = actor_;
  row.entered_at = at_;
  row.supersedes = out.superseded;
  row.audit_seq = seq_;
  out.response_id = records_->Insert(row);
  return out;
}

Result<RecordedResponse> AddResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry,
                                     int64_t seq, const std::string& actor, const std::string& at,
                                     const std::string& where, const ResponseRules& rules) {
  ResponseWriter writer(store, scheme, seq, actor, at, rules);
  return writer.Add(entry, where);
}

Result<RecordedResponse> RecordResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry) {
  AuditedWrite write(store, "record");
  auto r = AddResponse(store, scheme, entry, write.seq(), write.actor(), write.at(), "");
  if (!r.ok()) return r.error();
  const RecordedResponse& v = r.value();
  write.Commit(RecordSummary(entry.probe_ref, entry.code, v.late, v.superseded));
  return r;
}

Result<SendingRecord> AddSending(Store& store, const SendingEntry& e, int early_days, int64_t seq,
                                 const std::string& actor, const std::string& at, const std::string& where) {
  int64_t probe_id = FindProbe(store, e.probe_ref);
  if (probe_id == 0)
    return BadInput(where, "unknown probe '" + e.probe_ref + "'", "use a probe reference from 'twinprobe schedule'");
  const auto& channels = ResponseChannels();
  if (!e.channel.empty() && std::find(channels.begin(), channels.end(), e.channel) == channels.end())
    return BadInput(where, "unknown channel '" + e.channel + "'" + DidYouMean(e.channel, channels),
                    "use mail, phone, letter or other");
  std::string text = e.sent_at.empty() ? at : e.sent_at;
  auto t = ParseEventTime(text);
  if (!t) return BadInput(where, "'" + text + "' " + WhyNotATime(text, "is not a date or time"), kTimeFormat);
  if (auto w = WithdrawalOfProbe(store, probe_id); w && LastSentAt(store, probe_id).empty())
    return BadInput(where, e.probe_ref + " belongs to vacancy " + w->vacancy_ref + ", withdrawn at " + w->withdrawn_at +
                            " (" + w->reason + "), so it is not to be sent",
                    "send only what 'twinprobe schedule' lists; a withdrawn vacancy's unsent applications are left out");
  SendingRecord out;
  out.probe_ref = e.probe_ref;
  out.sent_at = t->text();

  TimeRules rules = StudyTimeRules(store, early_days);
  rules.now = ParseIsoTime(at).value_or(rules.now);
  if (Status plausible = CheckPlausibleTime(rules, TimedFact{TimedEvent::kSending, e.probe_ref, *t, std::nullopt, ""},
                                            where);
      !plausible.ok())
    return plausible.error();
  out.previous_sent_at = LastSentAt(store, probe_id);
  if (auto answered = CurrentResponseReceivedAt(store, probe_id)) {
    EventTime received = ParseEventTime(*answered).value_or(EventTime{});
    if (IsBefore(received, *t))
      return BadInput(where, e.probe_ref + " already has a response received " + *answered + ", before " + out.sent_at,
                      "check the date; a probe is sent before it is answered");
  }
  SendingRow row{probe_id, out.sent_at, actor, at, seq, e.channel, e.sent_by};
  InsertSending(store, row);
  return out;
}

Result<SendingRecord> RecordSending(Store& store, const std::string& probe_ref, const std::string& sent_at,
                                    int early_days) {
  AuditedWrite write(store, "sent");
  auto r = AddSending(store, SendingEntry{probe_ref, sent_at, "", ""}, early_days, write.seq(), write.actor(),
                      write.at(), "");
  if (!r.ok()) return r.error();
  write.Commit(SentSummary(probe_ref, r.value().sent_at, r.value().previous_sent_at));
  return r;
}

Result<std::string> MarkSent(Store& store, const std::string& probe_ref, const std::string& sent_at) {
  auto r = RecordSending(store, probe_ref, sent_at);
  if (!r.ok()) return r.error();
  return r.value().sent_at;
}

}  // namespace twinprobe
