#pragma once
// The order of the listing audit's "strongest evidence" list (text and HTML
// reports): the stratum comparisons by adjusted p, and where adjusted p
// values tie (Holm and Bonferroni cap many at 1) by raw p, so a comparison
// with raw p 0.0888 is never listed after one with 0.931 (issue 24).
#include <vector>

#include "analysis/listing_analysis.h"

namespace twinprobe {

// Pointers into `audit.by_stratum`, strongest evidence first: by adjusted p
// when the comparisons carry one (else by raw p), ties by raw p, then in
// their stored order. Valid while `audit` lives.
std::vector<const ListingComparison*> StrongestEvidence(const ListingAudit& audit);

}  // namespace twinprobe
