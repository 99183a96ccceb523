#pragma once
// The interim looks `monitor` took, as the store keeps them (table
// monitor_look, migration 8): each look is a record, sealed in the audit
// chain with its boundary, the alpha spent so far and its decision, so a
// later look spends only what the stored looks left and `analyze` can tell
// that a study stopped early. Rows are only added. SQLite failures throw
// StoreError (core/store.h).
#include <cstdint>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct StoredLook {
  int64_t look = 0;            // 1, 2, ... in the order taken
  std::string kind;            // planned | unplanned | final
  int64_t sets = 0;            // completed sets the look analysed
  int64_t planned_sets = 0;    // sets of the plan when the look was taken
  double information = 0;      // information fraction in (0, 1]
  int64_t discordant = 0;      // reference_only + other_only
  int64_t reference_only = 0;  // b
  int64_t other_only = 0;      // c
  int64_t lower = -1;          // exact boundary: stop when b <= lower or b >= discordant - lower; -1 none
  double alpha = 0.05;         // overall two-sided alpha
  std::string spending;        // obf | pocock
  double alpha_allowed = 0;    // alpha(t) of the spending function, cumulative
  double alpha_spent = 0;      // exact cumulative type I error up to this look
  std::string decision;        // continue | stop | final
  std::string taken_at;        // ISO time (the study clock)
  int64_t audit_seq = 0;
};

// Every stored look, in the order taken.
std::vector<StoredLook> ReadMonitorLooks(Store& store);

// Adds `looks` (audit_seq ignored) sealed under audit entry `seq`. Requires:
// inside that entry's AuditedWrite.
void InsertMonitorLooks(Store& store, const std::vector<StoredLook>& looks, int64_t seq);

// Stores `look` in its own audited write ("monitor", summary from
// core/audit_summaries.h MonitorLookSummary), taken at the write's time.
// Returns the look as stored and the new chain head.
StoredLook RecordMonitorLook(Store& store, StoredLook look, std::string* head);

}  // namespace twinprobe
