#pragma once
// The store side of responses and sendings: finding a probe of the current
// plan, its newest sending and current response, and appending response
// rows. The rules (codes, channels, windows, messages) stay with the
// collector (collector/responses.h); these functions only read and write.
// SQLite failures throw StoreError (core/store.h).
#include <cstdint>
#include <optional>
#include <string>

#include "core/store.h"

namespace twinprobe {

// One response row as appended (never updated: a correction supersedes).
struct ResponseRow {
  int64_t probe_id = 0;
  std::string code;
  std::optional<std::string> received_at;  // none: the time is unknown
  std::optional<std::string> channel;
  std::optional<std::string> note;         // stored with its SHA-256 beside it
  std::string origin;                      // record | import | mail-review | demo
  std::string flags;                       // "late" or ""
  std::string entered_by, entered_at;
  int64_t supersedes = 0;                  // response id it replaces, 0 if none
  int64_t audit_seq = 0;
};

// The id of the current plan's probe `ref`; 0 if it has none.
int64_t FindCurrentProbe(Store& store, const std::string& ref);

// Reads and writes for many responses under one audit entry, with each
// statement prepared once (imports add thousands through one of these).
class ResponseRecords {
 public:
  explicit ResponseRecords(Store& store);

  int64_t FindProbe(const std::string& ref);
  // The probe's newest sending time, "" when it was never sent.
  std::string LastSentAt(int64_t probe_id);
  // The probe's current response id (the newest nothing supersedes), 0 if none.
  int64_t CurrentResponseId(int64_t probe_id);
  // Appends `row`; returns its id.
  int64_t Insert(const ResponseRow& row);

 private:
  Store& store_;
  Stmt find_probe_, last_sending_, current_, insert_;
};

// The code of the probe's current response, if it has one.
std::optional<std::string> CurrentResponseCode(Store& store, int64_t probe_id);

}  // namespace twinprobe
