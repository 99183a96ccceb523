#pragma once
// The small text helpers every module needs, once. Lower and Trim are ASCII
// only on purpose: they serve protocol words (header names, robots.txt
// fields, URL schemes, design keys), where a locale's idea of case or space
// would be wrong. The widths count UTF-8 code points (not display columns:
// no wide or combining characters are assumed in names and strata).
#include <cstddef>
#include <string>
#include <string_view>

namespace twinprobe {

// `s` with A-Z turned into a-z; every other byte (UTF-8 included) unchanged.
std::string Lower(std::string_view s);

// Number of Unicode code points in UTF-8 `text` (bytes that do not continue
// a sequence). What a table column or a chart label's width counts: a byte
// count would shift a row holding "Weidenbrück" or "Søren" by one column.
size_t CodePoints(std::string_view text);

// `text` followed by spaces up to `width` code points; unchanged when it is
// already that wide or wider (as printf's "%-Ns" does). The one way a text
// table pads user-supplied text (stratum values, group and level names,
// profile names, employer keys, office names).
std::string PadRight(std::string_view text, size_t width);

// Spaces up to `width` code points, then `text` (right-aligned, "%Ns").
std::string PadLeft(std::string_view text, size_t width);

// `s` without leading and trailing ASCII white space (space, \t, \n, \v, \f,
// \r); a view into the same characters.
std::string_view Trim(std::string_view s);

}  // namespace twinprobe
