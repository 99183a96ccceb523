#pragma once
// Checks twinprobe's stats/ against reference values written by R (and
// scipy / statsmodels) in the format of tests/reference/reference.R:
//   kind<TAB>arguments<TAB>key=v1[,v2]...
// For each line the same quantity is computed here and compared: 1e-9
// relative for every value, except keys ending in _r (R's own uniroot
// solutions, good to about 1e-4 on the psi or 1/psi scale, so compared within
// that tolerance).
#include <string>
#include <vector>

namespace twinprobe::testing {

struct ReferenceSummary {
  int lines = 0;
  int checks = 0;            // scalar values compared at 1e-9
  int loose_checks = 0;      // scalar values compared within R's uniroot tolerance
  int underflow_checks = 0;  // p-values where both sides are below 1e-300
  double max_rel_error = 0;  // over the 1e-9 checks
  std::vector<std::string> failures;  // one line per failed value
};

// Compares every line of a reference file's text (lines starting with '#'
// are comments).
ReferenceSummary CheckReferenceText(const std::string& text);

}  // namespace twinprobe::testing
