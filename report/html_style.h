#pragma once
// The report's inline stylesheet: light background, dark text, the
// Okabe–Ito accent blue, and print rules for A4 (page size and margins,
// no breaks inside figures and tables, headings kept with what follows).
// It references nothing outside the file (no fonts, no images, no @import).
#include <string>

namespace twinprobe {

const std::string& ReportCss();

}  // namespace twinprobe
