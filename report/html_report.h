#pragma once
// The study report as one self-contained HTML file (`report --out FILE.html`):
// inline CSS and inline SVG charts, no scripts, no external resources, so it
// can be mailed and opened anywhere, and it prints on A4.
//
// Sections (their ids are stable anchors; docs/report.md explains each):
// summary, design, rates, paired (paired designs), strata (when the pairs
// have strata), responses, employers (when vacancies carry employer keys),
// methods, cautions, stamp. Every user-supplied string goes through
// EscapeHtml (report/html_escape.h). Numbers come only from the result.
#include <string>
#include <vector>

#include "analysis/analyze.h"
#include "report/report_context.h"

namespace twinprobe {

std::string RenderHtmlReport(const AnalysisResult& result, const ReportContext& context);

// The ids of the sections that RenderHtmlReport writes for `result`, in order.
std::vector<std::string> HtmlSectionIds(const AnalysisResult& result);

}  // namespace twinprobe
