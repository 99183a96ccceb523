#pragma once
// `purge`: the end of the retention period (ethics/data-protection.md).
// Deletes employer identities and contacts, the pseudonym secret, raw web
// snapshots, rendered materials and free-text notes; keeps the pseudonymised
// outcomes so the analysis still runs and gives the same numbers; records
// what it did in the audit chain.
#include <cstdint>
#include <string>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct PurgeCounts {
  int64_t employers = 0;
  int64_t secrets = 0;
  int64_t notes = 0;           // response notes
  int64_t mail_excerpts = 0;   // excerpts of mail messages
  int64_t snapshot_files = 0;  // files under snapshots/
  int64_t material_files = 0;  // files under materials/
  std::string fieldwork_end;   // ISO time the retention period counts from
  std::string retention_ends;  // ISO time purge becomes allowed
  bool already_purged = false;
};

// Counts what a purge would delete in the study folder `study_dir` and its
// store, and when it becomes allowed. Fieldwork ends at the latest sending,
// response or listing fetch recorded.
PurgeCounts PlanPurge(Store& store, const std::string& study_dir, int retention_days);

// Performs the purge. Refuses (bad input) before the retention period has
// passed at `now`, unless nothing identifying is left. The store part is one
// audited transaction; files are deleted only after it committed.
Result<PurgeCounts> Purge(Store& store, const std::string& study_dir, int retention_days, int64_t now);

}  // namespace twinprobe
