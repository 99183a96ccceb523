#pragma once
// The sentence that reports the employer sign-flip test (inference clustered
// by employer, analysis/employer_outcomes.h), shared by the text and HTML
// reports so both name the test, its sidedness and its decision alike.
#include <string>

#include "analysis/analyze.h"

namespace twinprobe {

// Empty when the test was not run (no paired design with employer keys).
// Otherwise one or two sentences: the test, two-sided, its decision at the
// study's alpha and p; and, when its decision differs from the pair-level
// exact McNemar test's, a note saying so and why.
std::string EmployerFlipSentence(const AnalysisResult& r);

}  // namespace twinprobe
