#include "collector/listing_store.h"

#include <nlohmann/json.hpp>

namespace twinprobe {
namespace {

nlohmann::json FingerprintOf(bool ok, const std::string& error, const std::vector<ListingItemRow>& items) {
  nlohmann::json j{{"ok", ok}, {"error", ok ? "" : error}, {"items", nlohmann::json::array()}};
  for (const auto& it : items) j["items"].push_back({it.position, it.item_key, nlohmann::json::parse(it.fields_json)});
  return j;
}

std::vector<ListingItemRow> ItemRows(const Extraction& x) {
  std::vector<ListingItemRow> rows;
  if (!x.ok) return rows;  // a failed extraction stores no items
  for (const ExtractedItem& it : x.items) rows.push_back({it.position, it.key, FieldsJson(it)});
  return rows;
}

}  // namespace

std::string FieldsJson(const ExtractedItem& item) {
  nlohmann::json j = nlohmann::json::object();
  for (const auto& [name, value] : item.fields) j[name] = value;
  return j.dump();
}

int64_t InsertListing(Store& store, int64_t seq, const ListingRow& row, const Extraction& x) {
  ListingPageRow page = row;
  page.extraction = x.ok ? ExtractionState::kOk : ExtractionState::kFailed;
  page.extraction_error = x.ok ? std::string() : x.error;
  return InsertListingPage(store, seq, page, ItemRows(x));
}

void InsertFetchLog(Store& store, int64_t seq, const FetchLogEntry& e) { InsertFetchLogRow(store, seq, e); }

void InsertReplay(Store& store, int64_t seq, int64_t new_id, int64_t replaced_id) {
  InsertListingReplay(store, seq, new_id, replaced_id);
}

std::vector<StoredListing> CurrentListings(Store& store, const std::string& source) {
  return ReadCurrentListingPages(store, source);
}

std::string ExtractionFingerprint(const Extraction& x) { return FingerprintOf(x.ok, x.error, ItemRows(x)).dump(); }

std::string StoredFingerprint(Store& store, int64_t listing_id) {
  std::optional<StoredExtraction> stored = ReadStoredExtraction(store, listing_id);
  if (!stored) return {};
  return FingerprintOf(stored->extraction == ExtractionState::kOk, stored->error, stored->items).dump();
}

}  // namespace twinprobe
