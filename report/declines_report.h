#pragma once
// The declines of positive responses (analysis/declines.h) as text, JSON and
// the HTML report's section: how many were due, declined on time or late,
// missing, or still within the deadline, with the rule in the words
// `record` and `decline` use.
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "report/report_context.h"

namespace twinprobe {

// The section applies once a positive response is on record.
bool HasDeclines(const AnalysisResult& r);
// "" when there is no positive response.
std::string RenderDeclinesText(const AnalysisResult& r);
// null when there is no positive response.
nlohmann::json DeclinesJson(const DeclineCounts& d);
// The HTML part: the counts as a table, the rule and the ethics sentence.
std::string DeclinesSection(const AnalysisResult& r, const ReportContext& ctx);

}  // namespace twinprobe
