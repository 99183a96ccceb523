#include "collector/responses.h"

#include <algorithm>

#include "collector/event_time.h"
#include "core/audit.h"
#include "core/sha256.h"
#include "core/suggest.h"

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

int64_t FindProbe(Store& store, const std::string& probe_ref) {
  Stmt s = store.Prepare("SELECT id FROM current_probe WHERE ref = ?1");
  s.Bind(1, probe_ref);
  return s.Step() ? s.Int(0) : 0;
}

ResponseWriter::ResponseWriter(Store& store, const OutcomeScheme& scheme, int64_t seq, std::string actor,
                               std::string at)
    : store_(store),
      scheme_(scheme),
      seq_(seq),
      actor_(std::move(actor)),
      at_(std::move(at)),
      find_probe_(store.Prepare("SELECT id FROM current_probe WHERE ref = ?1")),
      last_sending_(store.Prepare("SELECT sent_at FROM sending WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1")),
      current_(store.Prepare("SELECT id FROM current_response WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1")),
      insert_(store.Prepare(
          "INSERT INTO response(probe_id, code, received_at, channel, note, note_sha256, origin, flags, entered_by, "
          "entered_at, supersedes, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12)")) {}

Result<RecordedResponse> ResponseWriter::Add(const ResponseEntry& e, const std::string& where,
                                             const TimeReading& time) {
  find_probe_.Bind(1, e.probe_ref);
  int64_t probe_id = find_probe_.Step() ? find_probe_.Int(0) : 0;
  find_probe_.Reset();
  if (probe_id == 0)
    return BadInput(where, "unknown probe '" + e.probe_ref + "'",
                    "use a probe reference from 'twinprobe schedule' or the plan (e.g. P00001)");
  if (!scheme_.has_code(e.code))
    return BadInput(where, "'" + e.code + "' is not a response code of this study" + DidYouMean(e.code, scheme_.codes),
                    "use one of: " + JoinCodes(scheme_.codes));
  const auto& channels = ResponseChannels();
  if (!e.channel.empty() && std::find(channels.begin(), channels.end(), e.channel) == channels.end())
    return BadInput(where, "unknown channel '" + e.channel + "'" + DidYouMean(e.channel, channels),
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
      return BadInput(where, (time.label.empty() ? "" : time.label + " ") + "'" + text + "' is not a date or time",
                      kTimeFormat);
    out.received_at = received->text();
  }

  last_sending_.Bind(1, probe_id);
  if (last_sending_.Step()) out.sent_at = last_sending_.Text(0);
  last_sending_.Reset();
  if (out.sent_at.empty()) {
    out.unsent = true;
  } else if (received) {
    EventTime sent = ParseEventTime(out.sent_at).value_or(EventTime{});
    if (IsBefore(*received, sent))
      return BadInput(where, "the response time " + out.received_at + " is before the probe was sent (" + out.sent_at + ")",
                      "check the date; a response cannot precede the application");
    out.late = IsAfterWindow(sent, *received, scheme_.window_days);
    out.days_after_sending = DaysBetween(sent, *received);
  }

  current_.Bind(1, probe_id);
  if (current_.Step()) out.superseded = current_.Int(0);
  current_.Reset();

  insert_.Bind(1, probe_id).Bind(2, e.code);
  if (received) insert_.Bind(3, out.received_at);
  else insert_.BindNull(3);
  if (e.channel.empty()) insert_.BindNull(4);
  else insert_.Bind(4, e.channel);
  if (e.note.empty()) insert_.BindNull(5).BindNull(6);
  else insert_.Bind(5, e.note).Bind(6, Sha256Hex(e.note));
  insert_.Bind(7, e.origin).Bind(8, out.late ? "late" : "").Bind(9, actor_).Bind(10, at_);
  if (out.superseded) insert_.Bind(11, out.superseded);
  else insert_.BindNull(11);
  insert_.Bind(12, seq_).Run();
  out.response_id = store_.LastInsertId();
  return out;
}

Result<RecordedResponse> AddResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry,
                                     int64_t seq, const std::string& actor, const std::string& at,
                                     const std::string& where) {
  ResponseWriter writer(store, scheme, seq, actor, at);
  return writer.Add(entry, where);
}

Result<RecordedResponse> RecordResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry) {
  AuditedWrite write(store, "record");
  auto r = AddResponse(store, scheme, entry, write.seq(), write.actor(), write.at(), "");
  if (!r.ok()) return r.error();
  const RecordedResponse& v = r.value();
  write.Commit("record " + entry.probe_ref + " " + entry.code + (v.late ? " (late)" : "") +
               (v.superseded ? " (supersedes response " + std::to_string(v.superseded) + ")" : ""));
  return r;
}

Result<SendingRecord> RecordSending(Store& store, const std::string& probe_ref, const std::string& sent_at) {
  AuditedWrite write(store, "sent");
  int64_t probe_id = FindProbe(store, probe_ref);
  if (probe_id == 0)
    return BadInput("", "unknown probe '" + probe_ref + "'", "use a probe reference from 'twinprobe schedule'");
  std::string text = sent_at.empty() ? write.at() : sent_at;
  auto t = ParseEventTime(text);
  if (!t) return BadInput("", "'" + text + "' is not a date or time", kTimeFormat);
  SendingRecord out;
  out.probe_ref = probe_ref;
  out.sent_at = t->text();

  Stmt prev = store.Prepare("SELECT sent_at FROM sending WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1");
  prev.Bind(1, probe_id);
  if (prev.Step()) out.previous_sent_at = prev.Text(0);
  Stmt answered = store.Prepare(
      "SELECT received_at FROM current_response WHERE probe_id = ?1 AND received_at IS NOT NULL ORDER BY id DESC LIMIT 1");
  answered.Bind(1, probe_id);
  if (answered.Step()) {
    EventTime received = ParseEventTime(answered.Text(0)).value_or(EventTime{});
    if (IsBefore(received, *t))
      return BadInput("", probe_ref + " already has a response received " + answered.Text(0) + ", before " + out.sent_at,
                      "check the date; a probe is sent before it is answered");
  }
  Stmt ins = store.Prepare(
      "INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)");
  ins.Bind(1, probe_id).Bind(2, out.sent_at).Bind(3, write.actor()).Bind(4, write.at()).Bind(5, write.seq()).Run();
  write.Commit("sent " + probe_ref + " at " + out.sent_at +
               (out.previous_sent_at.empty() ? "" : " (replaces " + out.previous_sent_at + ")"));
  return out;
}

Result<std::string> MarkSent(Store& store, const std::string& probe_ref, const std::string& sent_at) {
  auto r = RecordSending(store, probe_ref, sent_at);
  if (!r.ok()) return r.error();
  return r.value().sent_at;
}

}  // namespace twinprobe
