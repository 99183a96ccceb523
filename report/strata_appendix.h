#pragma once
// The HTML report's appendix for records of an unpaired study with strata
// (requisitions, sites): one compact table per stratum value, counts by
// group and outcome with the stratum's Fisher p against the reference. The
// body of the report keeps the tests across strata; these tables are only
// here and in the JSON, never in the text report (168 requisitions would be
// 168 blocks of text).
#include <string>

#include "analysis/analyze.h"
#include "report/report_context.h"

namespace twinprobe {

// True when the appendix has tables: records of an unpaired study with
// per-stratum comparisons.
bool HasStrataAppendix(const AnalysisResult& r);
std::string StrataAppendix(const AnalysisResult& r, const ReportContext& ctx);

}  // namespace twinprobe
