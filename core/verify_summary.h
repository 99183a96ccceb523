#pragma once
// An audit entry's summary is what a reader of the chain (and of `history`)
// takes the entry to have done: "record P00017 invitation". The rows it
// sealed must say the same; otherwise something changed them as they were
// written (a trigger planted in the store, say), and the chain alone would
// seal the changed rows as faithfully as true ones.
//
// For every command whose summary states facts about single rows (record,
// sent, decline, review, withdraw), the summary is rebuilt from the sealed rows in the
// exact wording the command uses, and compared with the stored one;
// `import outcomes` and `import sendings` are checked by their row counts. The wording is a stored
// format with one definition, core/audit_summaries.h, which the commands
// and this check both call (tests/core/verify_test.cpp writes each through
// the real command).
#include <vector>

#include "core/audit.h"

namespace twinprobe {

class Store;

// One problem per entry whose summary disagrees with its rows, with the
// entry's command, actor, time and summary filled in.
std::vector<AuditProblem> CheckSummaries(Store& store);

}  // namespace twinprobe
