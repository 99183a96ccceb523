#pragma once
// Recording what came back to a probe (DESIGN.md: response), marking probes
// sent, and importing outcomes from CSV. Nothing is overwritten: a new
// response to a probe that already has one supersedes it, and both stay.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct ResponseEntry {
  std::string probe_ref;    // e.g. P00042 (current plan)
  std::string code;         // one of the scheme's codes
  std::string received_at;  // ISO time; "" means now
  std::string channel;      // mail | phone | letter | other | "" (unknown)
  std::string note;
  std::string origin = "record";
};

struct RecordedResponse {
  int64_t response_id = 0;
  int64_t superseded = 0;  // id of the response it replaces, 0 if none
  bool late = false;       // received outside the observation window
  bool positive = false;
  std::string probe_ref;
  std::string code;
  std::string received_at;
};

// Validates `entry` and adds it under audit entry `seq`. `where` prefixes
// messages (e.g. "file.csv:12"). Errors: unknown probe, code outside the
// scheme, unknown channel, unreadable time, a time before the probe was sent.
Result<RecordedResponse> AddResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry,
                                     int64_t seq, const std::string& actor, const std::string& at,
                                     const std::string& where);

// One `record` command: AddResponse in its own audited transaction.
Result<RecordedResponse> RecordResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry);

// Marks a probe as sent at `sent_at` (ISO; "" = now), in its own transaction.
Result<std::string> MarkSent(Store& store, const std::string& probe_ref, const std::string& sent_at);

struct ImportOptions {
  bool skip_bad = false;
  std::string reject_path;  // with skip_bad: where bad rows go (CSV with a reason column)
};

struct ImportSummary {
  int64_t rows_landed = 0;
  int64_t rows_rejected = 0;
  bool already_imported = false;  // same file content imported before: nothing added
  std::string audit_hash;
};

// `import outcomes FILE.csv`: columns probe, code, and optionally received_at,
// channel, note. All or nothing unless options.skip_bad.
Result<ImportSummary> ImportOutcomes(Store& store, const OutcomeScheme& scheme, const std::string& path,
                                     const ImportOptions& options);

// Looks up a probe of the current plan by its reference; 0 if unknown.
int64_t FindProbe(Store& store, const std::string& probe_ref);

}  // namespace twinprobe
