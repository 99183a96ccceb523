#pragma once
// The headline verdict and the "How sure we are" paragraph for designs the
// paired wording (report/plain_summary.cpp) does not cover: unpaired
// studies, a factor with three or more levels, and two factors. Plain words
// over numbers the AnalysisResult holds; each names its test and sidedness.
#include <string>

#include "analysis/analyze.h"

namespace twinprobe {

// "" when the result has a paired table (the paired wording applies) or
// nothing to judge.
std::string SetsHeadline(const AnalysisResult& result);
std::string SetsHowSure(const AnalysisResult& result);

}  // namespace twinprobe
