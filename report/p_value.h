#pragma once
// The one rule for printing a p-value, used by every output: analyze and
// report (text, HTML, JSON-free summaries), monitor and calc.
//
//   NaN                  "not defined"
//   p >= 0.001           three significant digits: "0.0312", "0.5", "1"
//   1e-16 <= p < 0.001   "3.12e-05"
//   p < 1e-16            "< 1e-16"
//
// Below 1e-16 (about the spacing of doubles near 1) a p-value computed as
// 1 - F(x) has no correct digit left, and no decision at any usual alpha
// depends on the digits; R prints such values as "< 2.2e-16" for the same
// reason (format.pval, eps = .Machine$double.eps). An exact p kept in log
// space (stats::PValue) adds its base-10 logarithm, which stays exact.
#include <string>

#include "stats/pvalue.h"

namespace twinprobe {

// The value alone, for a table cell: "0.0312", "3.12e-05", "< 1e-16".
std::string FormatP(double p);
// As above, with "(log10 p = -412.7)" after "< 1e-16".
std::string FormatP(const stats::PValue& p);

// The value with its relation, for a sentence: "p = 0.0312", "p < 1e-16"
// (never "p = < 1e-16"), "p not defined".
std::string PEquals(double p);
std::string PEquals(const stats::PValue& p);

}  // namespace twinprobe
