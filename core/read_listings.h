#pragma once
// The ranked lists in the store, as the listing audit reads them
// (analysis/listing_analysis.h): every usable list with its items in order,
// the strata (query x location), and each item's newest label per factor.
//
// Which stored rows make up a list: a fetched list of several pages is one
// row per page (positions from 1 on each page), joined in page order; a list
// stops at its first missing or failed page. Rows without a page number
// (import ranks) are whole lists. Rows replaced by `fetch --replay` are left
// out. The reference level of a factor is the plan's reference level when
// the store holds a plan with that factor, else the level with the most
// appearances (ties: alphabetical).
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

namespace twinprobe {

class Store;

struct ListingAppearance {
  int32_t listing = 0;    // index into Data::listings
  int32_t position = 0;
  int32_t item = 0;       // index into Data::item_keys
};

struct ListingList {
  int32_t stratum = 0;
  std::string seen_by;
  std::vector<int32_t> appearances;  // indices into Data::appearances
};

struct ListingData {
  std::vector<std::string> item_keys;
  std::vector<ListingAppearance> appearances;
  std::vector<ListingList> listings;
  std::vector<std::pair<std::string, std::string>> strata;  // query, location
  std::vector<std::string> factors;
  std::vector<std::vector<std::string>> levels;           // per factor, reference first
  std::vector<std::vector<int32_t>> item_level;            // per item: level index per factor (-1 = none)
  int64_t stored_rows = 0;  // listing rows in the store, usable or not
};

ListingData ReadListings(Store& store);

}  // namespace twinprobe
