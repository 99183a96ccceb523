#pragma once
// Rendering of analysis/adjusted_model.h: the arm effect adjusted for
// template and send position, as text (text_report.cpp) and JSON
// (json_report.cpp), printed beside the conditional odds ratio.
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"

namespace twinprobe {

// "" when result.adjusted is not present.
std::string RenderAdjustedText(const AnalysisResult& result);
nlohmann::json AdjustedJson(const AdjustedModel& model);

}  // namespace twinprobe
