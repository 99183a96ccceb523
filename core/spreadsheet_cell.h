#pragma once
// CSV cells that a spreadsheet will not run as formulas.
//
// Spreadsheet programs treat a cell that begins with '=', '+', '-' or '@'
// (and, in some, a tab or carriage return before one) as a formula, so a
// stratum, reference, name, note or actor such as =HYPERLINK(...) would run
// when the export is opened ("CSV injection"). The common practice, which
// the OWASP "CSV Injection" page describes, is to prefix such a cell with a
// single quote, which the spreadsheet shows as text. Machine readers (R,
// pandas) want the cells as they are: the writers take a flag for that
// (`export --raw-cells`, `import ... --raw-cells`).
#include <string>
#include <string_view>

namespace twinprobe {

// True when `cell` begins with '=', '+', '-', '@', a tab or a carriage return.
bool LooksLikeFormula(std::string_view cell);

// `cell` prefixed with "'" when LooksLikeFormula, else unchanged.
std::string NeutraliseCell(std::string_view cell);

}  // namespace twinprobe
