#include "analysis/listing_reference.h"

#include <algorithm>

namespace twinprobe {

ListingData WithListingReference(ListingData data, const Design* design) {
  if (!design) return data;
  for (size_t f = 0; f < data.factors.size() && f < data.levels.size(); ++f) {
    auto factor = std::find_if(design->factors.begin(), design->factors.end(),
                               [&](const Factor& x) { return x.name == data.factors[f]; });
    if (factor == design->factors.end()) continue;
    std::vector<std::string>& levels = data.levels[f];
    auto at = std::find(levels.begin(), levels.end(), factor->reference);
    if (at == levels.end() || at == levels.begin()) continue;
    // Rotating [0, k] moves level k first and shifts 0..k-1 up by one.
    const int32_t k = static_cast<int32_t>(at - levels.begin());
    std::rotate(levels.begin(), at, at + 1);
    for (auto& item : data.item_level) {
      if (f >= item.size() || item[f] < 0 || item[f] > k) continue;
      item[f] = item[f] == k ? 0 : item[f] + 1;
    }
  }
  return data;
}

}  // namespace twinprobe
