#pragma once
// Listing observations in the store (tables listing, listing_item,
// listing_replay, fetch_log; docs/fetch.md, "What is stored"). Every writer
// here runs inside the caller's AuditedWrite and tags rows with its seq.
#include <cstdint>
#include <string>
#include <vector>

#include "collector/extract.h"
#include "collector/fetch_session.h"
#include "core/store.h"

namespace twinprobe {

// One fetched list page and how its extraction went.
struct ListingRow {
  std::string source;
  std::string query;     // "" when the source has no queries
  std::string location;  // "" when the source has no locations
  int page = 1;
  std::string fetched_at;
  std::string url;
  int http_status = 0;
  std::string snapshot_sha256;
  bool extraction_ok = true;
  std::string extraction_error;
};

// Inserts the listing and, when the extraction succeeded, one listing_item
// per item (position, key, fields as a JSON object). Returns the listing id.
int64_t InsertListing(Store& store, int64_t seq, const ListingRow& row, const Extraction& extraction);

void InsertFetchLog(Store& store, int64_t seq, const FetchLogEntry& entry);

// Marks `new_id` as the replay of `replaced_id`.
void InsertReplay(Store& store, int64_t seq, int64_t new_id, int64_t replaced_id);

struct StoredListing {
  int64_t id = 0;
  ListingRow row;
};
// The current (not replaced) listings of a source, oldest first.
std::vector<StoredListing> CurrentListings(Store& store, const std::string& source);

// A canonical text of a listing's outcome: its status, error and items. Two
// extractions with equal text stored the same rows.
std::string ExtractionFingerprint(const Extraction& extraction);
std::string StoredFingerprint(Store& store, int64_t listing_id);

// The JSON object stored in listing_item.fields.
std::string FieldsJson(const ExtractedItem& item);

}  // namespace twinprobe
