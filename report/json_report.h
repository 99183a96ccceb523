#pragma once
// The analysis result as a stable JSON document (`analyze --json`,
// `report --json`). Keys are documented in docs/report.md.
#include <string>

#include "analysis/analyze.h"

namespace twinprobe {

// Pretty-printed JSON with a trailing newline.
std::string RenderJsonReport(const AnalysisResult& result);

}  // namespace twinprobe
