#pragma once
#include <cstdint>
#include <optional>
// What `report` and `demo` share: the context a rendered report carries
// (tool version, time, audit head, ethics approval; employer names only when
// revealed).
#include "analysis/analyze.h"
#include "cli/command.h"
#include "report/report_context.h"

namespace twinprobe {

// Reads the audit chain (ReadChainState) and, when the study has a design file,
// its ethics approval. With `reveal_employers`, loads the employer table
// (pseudonym -> name); the caller records that in the audit chain first.
ReportContext StudyReportContext(const Context& ctx, Store& store, bool reveal_employers);

// Fills the audit fields of `rc` (head, entries, intact, first problem) with
// what `verify` (core/verify.h) finds in the store at `store_path`, so a
// report never calls intact what verify calls broken.
void ReadChainState(const std::string& store_path, ReportContext& rc);

// Reads the study with core's read models (core/read_study.h) and analyses
// it (analysis/analyze.h): what `analyze`, `report` and `demo` run. `now`
// is the study clock for the window rule (nullopt: the computer's clock or
// $TWINPROBE_NOW); only the demo sets it, to the end of its simulated season.
Result<AnalysisResult> AnalyzeStore(Store& store, const OutcomeScheme& scheme, const AnalysisPlan& plan,
                                    const Design* current_design = nullptr,
                                    std::optional<int64_t> now = std::nullopt);

}  // namespace twinprobe
