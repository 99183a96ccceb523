#pragma once
// Reading and validating the design file, study.toml (docs/design-file.md, the
// reference). Every error names study.toml:LINE:COL and says how to fix it.
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "core/design.h"
#include "core/status.h"

namespace twinprobe {

// The most arms a design may have. Arms are counted before they are built,
// so a design above it (20 two-level factors with include = "all" would be
// 1,048,576 arms) is refused at once instead of costing gigabytes.
inline constexpr int64_t kMaxArms = 100;

// The most probes a plan may have (vacancies x probes per set), and so the
// most applications `render` writes. `check` holds a plan and its renderings
// in memory, about 3 KB a probe: 100,000 probes take some 300 MB. The
// vacancies beyond the bound are counted, never kept (planner/vacancies.h).
inline constexpr int64_t kMaxProbes = 100000;

// Reads DIR/study.toml. Files the design names (name pools, templates) are
// checked to exist inside DIR.
Result<Design> LoadDesign(const std::string& study_dir);

// Parses design text. `label` is the file name used in messages; `study_dir`
// is where referenced files are looked up ("" skips file checks).
Result<Design> ParseDesign(std::string_view text, const std::string& label, const std::string& study_dir);

// Path of the design file in a study folder.
std::string DesignPath(const std::string& study_dir);

// The keys the design reader accepts, section by section, in the order
// docs/design-file.md documents them (a test keeps the page and this list
// equal). "the design" lists the top-level sections. [[source]] and [mail]
// check their own keys (planner/source_section.h, planner/mail_section.h).
struct DesignSectionKeys {
  std::string section;  // as written in messages: "[study]", "[[factor]]", …
  std::vector<std::string> keys;
};
const std::vector<DesignSectionKeys>& KnownDesignKeys();

}  // namespace twinprobe
