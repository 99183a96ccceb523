#pragma once
// The small text helpers every module needs, once. ASCII only on purpose:
// they serve protocol words (header names, robots.txt fields, URL schemes,
// design keys), where a locale's idea of case or space would be wrong.
#include <string>
#include <string_view>

namespace twinprobe {

// `s` with A-Z turned into a-z; every other byte (UTF-8 included) unchanged.
std::string Lower(std::string_view s);

// `s` without leading and trailing ASCII white space (space, \t, \n, \v, \f,
// \r); a view into the same characters.
std::string_view Trim(std::string_view s);

}  // namespace twinprobe
