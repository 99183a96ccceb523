#pragma once
// Listing observations of `fetch` in the store (tables listing,
// listing_item, listing_replay, fetch_log; docs/fetch.md, "What is stored"):
// extractions turned into rows for core/listing_pages.h, and fingerprints to
// tell whether a replay changed a listing. Every writer here runs inside the
// caller's AuditedWrite and tags rows with its seq.
#include <cstdint>
#include <string>
#include <vector>

#include "collector/extract.h"
#include "collector/fetch_session.h"
#include "core/listing_pages.h"
#include "core/store.h"

namespace twinprobe {

// One fetched list page and how its extraction went (core/listing_pages.h).
using ListingRow = ListingPageRow;

// Inserts the listing and, when the extraction succeeded, one listing_item
// per item (position, key, fields as a JSON object). Returns the listing id.
int64_t InsertListing(Store& store, int64_t seq, const ListingRow& row, const Extraction& extraction);

void InsertFetchLog(Store& store, int64_t seq, const FetchLogEntry& entry);

// Marks `new_id` as the replay of `replaced_id`.
void InsertReplay(Store& store, int64_t seq, int64_t new_id, int64_t replaced_id);

// A listing with its id (core/listing_pages.h).
using StoredListing = StoredListingPage;

// The current (not replaced) listings of a source, oldest first.
std::vector<StoredListing> CurrentListings(Store& store, const std::string& source);

// A canonical text of a listing's outcome: its status, error and items. Two
// extractions with equal text stored the same rows.
std::string ExtractionFingerprint(const Extraction& extraction);
std::string StoredFingerprint(Store& store, int64_t listing_id);

// The JSON object stored in listing_item.fields.
std::string FieldsJson(const ExtractedItem& item);

}  // namespace twinprobe
