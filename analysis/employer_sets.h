#pragma once
// Sets of three or more probes grouped by employer pseudonym, for the
// report's employer section of a sets design (analysis/employer_outcomes.h
// covers pairs). A set is unequal when some of its probes were answered
// positively and some not. As there, a single unequal set is weak evidence
// about one employer; the section supports follow-up testing, not naming.
#include <cstdint>
#include <string>
#include <vector>

#include "core/fieldwork.h"

namespace twinprobe {

struct EmployerSetRow {
  std::string pseudonym;
  int64_t sets = 0;                  // analysed sets at this employer
  int64_t unequal = 0;               // of which some but not all probes positive
  std::vector<int64_t> positive;     // positives per arm (Fieldwork::arms order)
};

struct EmployerSetsSummary {
  bool available = false;        // sets of three or more probes with employer keys
  int64_t employers = 0;
  int64_t employers_unequal = 0; // with at least one unequal set
  // Employers with at least one unequal set, most unequal first, then by
  // pseudonym (a stable order that carries no other meaning).
  std::vector<EmployerSetRow> unequal_rows;
};

// `arms`: the number of arms. Sets of fewer than three probes are left out.
EmployerSetsSummary SummariseEmployerSets(const std::vector<EmployerSets>& sets, size_t arms);

}  // namespace twinprobe
