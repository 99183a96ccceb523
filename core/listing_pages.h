#pragma once
// Listing observations in the store: the listing, listing_item,
// listing_replay and fetch_log tables (docs/fetch.md, "What is stored";
// docs/ranks.md). Every writer runs inside the caller's AuditedWrite and tags
// its rows with that entry's seq. What a page holds and when it is stored
// are the collector's rules (collector/fetch_run.h, collector/import_ranks.h).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/store.h"
#include "core/stored_codes.h"

namespace twinprobe {

// One fetched list page and how its extraction went. Empty texts (and a
// zero status) are stored as NULL, except `url` and `snapshot_sha256`.
struct ListingPageRow {
  std::string source;
  std::string query;     // "" when the source has no queries
  std::string location;  // "" when the source has no locations
  int page = 1;
  std::string fetched_at;
  std::string url;
  int http_status = 0;
  std::string snapshot_sha256;
  ExtractionState extraction = ExtractionState::kOk;
  std::string extraction_error;  // stored only when the extraction failed
};

// One place of a list: its rank, the item's key and its fields as a JSON
// object.
struct ListingItemRow {
  int64_t position = 0;
  std::string item_key;
  std::string fields_json = "{}";
};

// Inserts the page and its items; returns the listing id.
int64_t InsertListingPage(Store& store, int64_t seq, const ListingPageRow& row,
                          const std::vector<ListingItemRow>& items);

// One list of an imported ranks file (docs/ranks.md): no page, status or
// snapshot; nullopt texts are stored as NULL.
struct RankedListingRow {
  std::string source;
  std::optional<std::string> query, location, seen_by;
  std::string fetched_at;
  std::string url;  // file:NAME#LISTING
};

// Appends ranked lists; statements are prepared once for a whole import.
class RankedListingWriter {
 public:
  explicit RankedListingWriter(Store& store);
  // Inserts the list; returns its listing id.
  int64_t InsertListing(int64_t seq, const RankedListingRow& row);
  void InsertItem(int64_t seq, int64_t listing_id, const ListingItemRow& item);

 private:
  Store& store_;
  Stmt listing_;
  Stmt item_;
};

// One row of fetch_log: every URL fetch considered (what each outcome means
// is the collector's, collector/fetch_session.h); an empty detail or
// snapshot (and a zero status) is stored as NULL.
struct FetchLogRow {
  std::string url;
  std::string at;
  std::string outcome;  // fetched | redirect | retry | failed | robots | allowlist | limit
  int http_status = 0;  // 0: none
  std::string detail;
  std::string snapshot_sha256;  // "" when no body was stored
};

void InsertFetchLogRow(Store& store, int64_t seq, const FetchLogRow& row);

// Marks listing `new_id` as the replay of `replaced_id`.
void InsertListingReplay(Store& store, int64_t seq, int64_t new_id, int64_t replaced_id);

struct StoredListingPage {
  int64_t id = 0;
  ListingPageRow row;
};

// The current (not replaced) listings of a source, oldest first. Throws
// StoreError on an extraction state this version does not know.
std::vector<StoredListingPage> ReadCurrentListingPages(Store& store, const std::string& source);

// What a stored listing's extraction gave: its state, error and items in
// position order.
struct StoredExtraction {
  ExtractionState extraction = ExtractionState::kOk;
  std::string error;
  std::vector<ListingItemRow> items;
};

// nullopt when there is no listing `listing_id`.
std::optional<StoredExtraction> ReadStoredExtraction(Store& store, int64_t listing_id);

}  // namespace twinprobe
