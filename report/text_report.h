#pragma once
// The analysis result as plain text that reads like a careful methods and
// results section (`analyze`, `report --text`).
#include <string>

#include "analysis/analyze.h"
#include "report/p_value.h"
#include "report/report_context.h"

namespace twinprobe {

std::string RenderTextReport(const AnalysisResult& result);
// The same text plus a reproducibility stamp (tool version, time, audit
// head) and, with --reveal-employers, employer names beside pseudonyms.
std::string RenderTextReport(const AnalysisResult& result, const ReportContext& context);

std::string FormatPercent(double rate);  // "24.8%"
// Plain text wrapped at 78 columns, each line prefixed by `indent`.
std::string Wrap(const std::string& text, const std::string& indent);

}  // namespace twinprobe
