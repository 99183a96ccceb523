#pragma once
// Where the fieldwork stands, in words every report format prints the same
// way: the sets still within their observation window, the empty and early
// states (nothing sent, nothing closed, one group only, a single stratum)
// and the flow of the
// study as lines of text. An early state replaces the findings: a report with
// nothing closed shows no rate and says nothing about employers.
#include <string>
#include <vector>

#include "analysis/analyze.h"

namespace twinprobe {

// "212 sets are still within their 28-day window and are not analysed yet."
// "" when no set is open.
std::string OpenSetsSentence(const AnalysisResult& r);

// One sentence saying what is missing and what to do next when there is
// nothing to report yet (nothing sent, nothing closed, closed sets of one
// group only); "" when there are findings to report.
std::string EarlyStateSentence(const AnalysisResult& r);

// One sentence per stratum column whose analysed sets all share one value
// (Effects::single_strata): which column, why it has no stratified analysis,
// and what to do. Empty when every column has two values or more.
std::vector<std::string> SingleStratumSentences(const AnalysisResult& r);

// The flow of the study as text lines, e.g.
//   "400 vacancies planned"
//   "  188 sets left out: no application sent yet"
//   "212 sets with every application sent" …
std::vector<std::string> FlowTextLines(const StudyFlow& flow);

}  // namespace twinprobe
