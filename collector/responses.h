#pragma once
// Recording what came back to a probe (docs/architecture.md: response) and marking
// probes sent. Nothing is overwritten: a new response to a probe that
// already has one supersedes it, and both stay; a second sending of a probe
// is a new row too, and the newest one counts.
//
// Times are UTC ISO 8601, stored as full times (core/clock.h); a date alone
// ("2027-03-04") is stored as midnight and checked as "that day"
// (collector/event_time.h).
#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

class ResponseRecords;

struct ResponseEntry {
  std::string probe_ref;    // e.g. P00042 (current plan)
  std::string code;         // one of the scheme's codes
  std::string received_at;  // ISO date or time; "" means now (unless time_unknown)
  std::string channel;      // mail | phone | letter | other | "" (unknown)
  std::string note;
  std::string origin = "record";
};

// What a writer demands beyond the entry itself.
struct ResponseRules {
  // The study clock for "not in the future"; none: the writer's entry time
  // `at` (NowIso). The demo's simulated season sets its own end.
  std::optional<int64_t> now;
};

// How a writer reads an entry's time (imports differ from `record`).
struct TimeReading {
  std::string label;          // names the time in messages, e.g. "received_at"; "" for --at
  bool unknown = false;       // store no time at all (e.g. code 'none' imported without one)
};

struct RecordedResponse {
  int64_t response_id = 0;
  int64_t superseded = 0;  // id of the response it replaces, 0 if none
  bool late = false;       // received outside the observation window (flag 'late')
  bool positive = false;
  std::string probe_ref;
  std::string code;
  std::string received_at;  // as stored ("" when unknown)
  std::string sent_at;      // the probe's newest sending, "" if none
  int64_t days_after_sending = 0;
};

// Adds validated responses under one audit entry, reusing its prepared
// statements (imports add thousands through one writer).
class ResponseWriter {
 public:
  ResponseWriter(Store& store, const OutcomeScheme& scheme, int64_t seq, std::string actor, std::string at,
                 ResponseRules rules = {});
  ~ResponseWriter();
  ResponseWriter(const ResponseWriter&) = delete;
  ResponseWriter& operator=(const ResponseWriter&) = delete;

  // Validates `entry` and adds it. `where` prefixes messages (e.g.
  // "file.csv:12"; "" for the command line). Errors (bad input): unknown
  // probe, code outside the scheme, unknown channel, unreadable time, a probe
  // with no sending (NoSendingError: every writer, no exception), a time that breaks the
  // plausible-time rules (collector/time_rules.h: year, future, before the
  // probe's newest sending). A time after the observation window is accepted
  // and flagged 'late'.
  Result<RecordedResponse> Add(const ResponseEntry& entry, const std::string& where, const TimeReading& time = {});

 private:
  const OutcomeScheme& scheme_;
  ResponseRules rules_;
  int64_t seq_;
  std::string actor_, at_;
  std::unique_ptr<ResponseRecords> records_;  // its statements, prepared once
};

// One response through a one-off ResponseWriter (kept for callers that add
// a single response inside their own audited write, e.g. the demo).
Result<RecordedResponse> AddResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry,
                                     int64_t seq, const std::string& actor, const std::string& at,
                                     const std::string& where, const ResponseRules& rules = {});

// One `record` command: Add in its own audited transaction.
Result<RecordedResponse> RecordResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry);

struct SendingRecord {
  std::string probe_ref;
  std::string sent_at;           // as stored
  std::string previous_sent_at;  // the sending it replaces, "" if none
};

struct SendingEntry {
  std::string probe_ref;
  std::string sent_at;  // ISO date or time, offsets allowed; "" means now
  std::string channel;  // mail | phone | letter | other | "" (unknown)
  std::string sent_by;  // who sent it; "" unknown
};

// Validates one sending and appends it under the caller's audit entry `seq`
// (`sent` and `import sendings` both go through here). `where` prefixes
// messages ("" for the command line). Errors (bad input): unknown probe,
// unreadable time, unknown channel, a time that breaks the plausible-time
// rules (collector/time_rules.h: year, future, before the schedule's start
// less [schedule] early_days), a sending time after the probe's current
// response arrived.
Result<SendingRecord> AddSending(Store& store, const SendingEntry& entry, int early_days, int64_t seq,
                                 const std::string& actor, const std::string& at, const std::string& where);

// One `sent` command in its own audited transaction (AddSending).
// `early_days` is the design's [schedule] early_days.
Result<SendingRecord> RecordSending(Store& store, const std::string& probe_ref, const std::string& sent_at,
                                    int early_days = 1);

// RecordSending, returning only the stored time.
Result<std::string> MarkSent(Store& store, const std::string& probe_ref, const std::string& sent_at);

// The refusal of a response, an import row or a form for a probe with no
// sending: names `sent PROBE --at TIME` and `import sendings` as the fix.
Error NoSendingError(const std::string& where, const std::string& probe_ref);

// Looks up a probe of the current plan by its reference; 0 if unknown.
int64_t FindProbe(Store& store, const std::string& probe_ref);

// The channels a response may come through.
const std::vector<std::string>& ResponseChannels();

}  // namespace twinprobe

// Importing outcomes lived here first; it has its own file now.
#include "collector/import_outcomes.h"  // IWYU pragma: export
