#pragma once
// Hiring stages (analysis/stages.h) as text, JSON and the HTML report's
// funnel section.
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "report/report_context.h"

namespace twinprobe {

// "" when the study has no stages.
std::string RenderStagesText(const AnalysisResult& r);
// null when the study has no stages.
nlohmann::json StagesJson(const HiringStages& h);
// The HTML part: a funnel chart (share of all applicants of each group that
// reached each stage) and the table of both rates with Fisher's test.
std::string StagesFunnel(const AnalysisResult& r, const ReportContext& ctx);

}  // namespace twinprobe
