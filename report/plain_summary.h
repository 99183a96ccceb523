#pragma once
// The plain-language summary: what was tested, what was found, how sure we
// are and what it does not show, in words for readers who never run a
// command (a board of commissioners, an editor, a works council). It only
// words numbers the AnalysisResult holds; the HTML and text reports print the
// same paragraphs.
#include <string>
#include <vector>

#include "analysis/analyze.h"

namespace twinprobe {

struct SummaryParagraph {
  std::string heading;  // "What was tested" …
  std::string text;     // plain text (user strings inside are not escaped)
};

std::vector<SummaryParagraph> PlainSummary(const AnalysisResult& result);

// One sentence a reader takes away (the first line of the summary), e.g.
// "Inland applicants received positive answers more often than coastal
// applicants (27.8% against 19.2%); chance alone is an unlikely explanation
// (p < 0.001)."
std::string Headline(const AnalysisResult& result);

// A p-value in words for the summary: "p < 0.001" below one in a thousand,
// else "p = 0.0312" (3 significant digits). Comparisons only, no arithmetic.
std::string PlainP(double p);

// How many applicant records a study holds, in the words every output uses:
// "129 applications in 14 vacancies", or "300 applications" when there is
// no vacancy column (each application is then its own vacancy, and there
// are no vacancies to speak of).
std::string RecordsExtent(int64_t applications, int64_t vacancies);

// A response code for people: underscores become spaces ("info_request" ->
// "info request").
std::string CodeName(const std::string& code);

// An arm's label for people: its levels without the factor names
// ("origin=inland" -> "inland"; "gender=f,origin=coastal" -> "f, coastal").
std::string ArmName(const std::string& label);
// The same with the design's display labels of levels ("age=45" -> "aged
// 45" when the design labels it; analysis/design_summary.h).
std::string ArmName(const AnalysisResult& result, const std::string& label);
// An arm's stored label for the technical text, followed by its display
// text when the design labels a level of it ("age=45 (aged 45)"); the
// label alone otherwise.
std::string ArmShown(const AnalysisResult& result, const std::string& label);

}  // namespace twinprobe
