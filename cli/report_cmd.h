#pragma once
// What `report` and `demo` share: the context a rendered report carries
// (tool version, time, audit head, ethics approval; employer names only when
// revealed).
#include "cli/command.h"
#include "report/report_context.h"

namespace twinprobe {

// Reads the audit chain (VerifyAudit) and, when the study has a design file,
// its ethics approval. With `reveal_employers`, loads the employer table
// (pseudonym -> name); the caller records that in the audit chain first.
ReportContext StudyReportContext(const Context& ctx, Store& store, bool reveal_employers);

}  // namespace twinprobe
