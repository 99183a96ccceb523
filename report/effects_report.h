#pragma once
// Rendering of analysis/effects.h results: the text section (called by
// text_report.cpp) and the JSON object (called by json_report.cpp). Every
// number of Effects appears in the JSON; the text reads as a methods and
// results section.
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"

namespace twinprobe {

// Numbers as the report sections print them: an estimate to 3 significant
// digits ("undefined" for NaN, "infinite"/"-infinite"), an interval as
// "[low, high]", a confidence level as "95%".
std::string FormatEstimate(double v);
std::string FormatInterval(const stats::Interval& ci);
std::string ConfidencePercent(double confidence);

std::string RenderEffectsText(const AnalysisResult& result);
nlohmann::json EffectsJson(const AnalysisResult& result);
// One sentence on the equivalence test (analysis/effects.h): the margin, the
// two one-sided tests and their level, the estimate with its 1 - 2 alpha
// Tango interval, p and whether equivalence is shown.
std::string EquivalenceSentence(const stats::EquivalenceResult& equivalence);

}  // namespace twinprobe
