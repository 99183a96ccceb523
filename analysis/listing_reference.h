#pragma once
// The reference group of a listing audit. The store alone knows no
// reference for a study without a plan, so core/read_listings.h puts the
// level with the most appearances first; a study.toml that declares the
// factor sets it instead (issue 24): its [[factor]] reference, by default
// the factor's first level, so every comparison reads "inland vs coastal"
// as the design says.
#include "core/design.h"
#include "core/read_listings.h"

namespace twinprobe {

// `data` with, for each factor the design declares whose reference level is
// among the stored levels, that level moved first (item levels renumbered to
// match). Factors the design does not declare, or `design` == nullptr, leave
// `data` as it is.
ListingData WithListingReference(ListingData data, const Design* design);

}  // namespace twinprobe
