#pragma once
// `merge`: brings offices' fieldwork back into the main store
// (collector/handout.h made their folders).
//
// Before anything is written, for every office: its store is verified as
// `verify` does (a broken chain refuses the merge, naming the entry); it must
// descend from this study's current plan (its sealed origin names the plan's
// hash, its first entry is the one the main store sealed at the handout, and
// the entry merged last time is still in its chain); and the probes it
// answered since the last merge must not have a different current response
// in the main store (entered there, or merged from elsewhere). Such
// conflicts are returned with both histories and nothing is written unless
// `prefer` says which side wins; the choice is sealed.
//
// Then each office is merged in its own transaction and audit entry (kill -9
// leaves it all or nothing): its sendings, responses (corrections too),
// declines, mail messages and review decisions written after the head merged
// last time, with their original times and people, and the office chain's
// head. An office with nothing new writes nothing.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/audit_summaries.h"
#include "core/design.h"
#include "core/office_records.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct MergeConflict {
  std::string office;
  ProbeHistories histories;
};

struct OfficeMergeOutcome {
  std::string office;
  std::string folder;
  ChainPoint head;            // the office chain's head
  bool nothing_new = false;   // this head was merged before: nothing written
  MergedRowCounts counts;
  std::vector<MergeConflict> resolved;  // conflicts decided by `prefer`
};

struct MergeOutcome {
  std::vector<OfficeMergeOutcome> offices;
  std::vector<MergeConflict> conflicts;  // non-empty: stopped, nothing written
};

// `prefer` is "main" or the name of one of the offices; nullopt leaves every
// conflict to stop the merge. Errors (bad input, nothing written): a folder
// without a store, a broken office chain, a store not handed out from this
// plan, an office named twice, an unknown `prefer`.
Result<MergeOutcome> MergeOffices(Store& main, const std::vector<std::string>& office_dirs,
                                  const std::optional<std::string>& prefer);

// `status`: per office, what was handed out, and of its probes how many the
// main store holds as sent and as closed (core/fieldwork.h IsClosed at `now`
// with the scheme's window) — that is, what merges brought back — and the
// office heads merged.
struct OfficeStatus {
  std::string office, folder, handed_at;
  int64_t vacancies = 0, probes = 0, sent = 0, closed = 0;
  std::vector<ChainPoint> merges;
};
std::vector<OfficeStatus> ReadOfficeStatuses(Store& main, const OutcomeScheme& scheme, int64_t now);

}  // namespace twinprobe
