#pragma once
// The analysis result as plain text that reads like a careful methods and
// results section (`analyze`, `report --text`).
#include <string>

#include "analysis/analyze.h"

namespace twinprobe {

std::string RenderTextReport(const AnalysisResult& result);

// Formats a probability for people: 3 significant digits, "< 1e-16" style
// below the smallest printable value.
std::string FormatP(double p);
std::string FormatPercent(double rate);  // "24.8%"

}  // namespace twinprobe
