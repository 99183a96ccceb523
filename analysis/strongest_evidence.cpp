#include "analysis/strongest_evidence.h"

#include <algorithm>

namespace twinprobe {

std::vector<const ListingComparison*> StrongestEvidence(const ListingAudit& audit) {
  std::vector<const ListingComparison*> rows;
  for (const auto& c : audit.by_stratum) rows.push_back(&c);
  auto adjusted = [](const ListingComparison* c) { return c->gap_p_adjusted ? *c->gap_p_adjusted : c->gap_p; };
  std::stable_sort(rows.begin(), rows.end(), [&](const ListingComparison* x, const ListingComparison* y) {
    if (adjusted(x) != adjusted(y)) return adjusted(x) < adjusted(y);
    return x->gap_p < y->gap_p;
  });
  return rows;
}

}  // namespace twinprobe
