#pragma once
// The analysis result as a stable JSON document (`analyze --json`,
// `report --json`). Keys are documented in docs/report.md.
#include <string>

#include "analysis/analyze.h"
#include "report/report_context.h"

namespace twinprobe {

// Pretty-printed JSON with a trailing newline.
std::string RenderJsonReport(const AnalysisResult& result);
// The same document plus a "report" object (tool version, time, audit head,
// whether employer names are shown) and, with --reveal-employers, each
// listed employer's name.
std::string RenderJsonReport(const AnalysisResult& result, const ReportContext& context);

}  // namespace twinprobe
