// core/listing_pages.h and core/listing_labels.h on an in-memory store.
#include <catch2/catch.hpp>

#include "core/listing_labels.h"
#include "core/listing_pages.h"
#include "core/store.h"

using namespace twinprobe;

namespace {

std::unique_ptr<Store> MemoryStore() {
  auto store = Store::Open(":memory:", true);
  REQUIRE(store.ok());
  return std::move(store.value());
}

ListingPageRow Page(const std::string& source) {
  ListingPageRow row;
  row.source = source;
  row.query = "clerk";
  row.page = 2;
  row.fetched_at = "2026-04-01T08:00:00Z";
  row.url = "http://127.0.0.1/jobs?q=clerk&page=2";
  row.http_status = 200;
  row.snapshot_sha256 = "cafe";
  return row;
}

}  // namespace

TEST_CASE("listing pages: a page with its items reads back as stored, empty texts as NULL") {
  auto store = MemoryStore();
  const int64_t id = InsertListingPage(*store, 3, Page("board"), {{1, "a", R"({"title":"Clerk"})"}, {2, "b", "{}"}});
  CHECK(store->QueryInt("SELECT count(*) FROM listing WHERE location IS NULL AND extraction_error IS NULL AND "
                        "extraction = 'ok' AND audit_seq = 3") == 1);
  auto pages = ReadCurrentListingPages(*store, "board");
  REQUIRE(pages.size() == 1);
  CHECK(pages[0].id == id);
  CHECK(pages[0].row.query == "clerk");
  CHECK(pages[0].row.location == "");
  CHECK(pages[0].row.page == 2);
  CHECK(pages[0].row.http_status == 200);
  CHECK(pages[0].row.extraction == ExtractionState::kOk);
  auto stored = ReadStoredExtraction(*store, id);
  REQUIRE(stored.has_value());
  REQUIRE(stored->items.size() == 2);
  CHECK(stored->items[0].position == 1);
  CHECK(stored->items[0].item_key == "a");
  CHECK(stored->items[0].fields_json == R"({"title":"Clerk"})");
  CHECK(ReadCurrentListingPages(*store, "other").empty());
  CHECK_FALSE(ReadStoredExtraction(*store, id + 1).has_value());
}

TEST_CASE("listing pages: a failed extraction keeps its error, a replay hides the listing it replaces") {
  auto store = MemoryStore();
  ListingPageRow failed = Page("board");
  failed.extraction = ExtractionState::kFailed;
  failed.extraction_error = "the list selector 'ol.results' matches nothing";
  const int64_t old_id = InsertListingPage(*store, 1, failed, {});
  auto stored = ReadStoredExtraction(*store, old_id);
  REQUIRE(stored.has_value());
  CHECK(stored->extraction == ExtractionState::kFailed);
  CHECK(stored->error == "the list selector 'ol.results' matches nothing");

  const int64_t new_id = InsertListingPage(*store, 2, Page("board"), {{1, "a", "{}"}});
  InsertListingReplay(*store, 2, new_id, old_id);
  auto pages = ReadCurrentListingPages(*store, "board");
  REQUIRE(pages.size() == 1);
  CHECK(pages[0].id == new_id);
}

TEST_CASE("listing pages: an extraction state this version does not know is a store error") {
  auto store = MemoryStore();
  InsertListingPage(*store, 1, Page("board"), {});
  store->Exec("INSERT INTO listing(source, fetched_at, extraction, audit_seq) VALUES ('board', 'x', 'partial', 2)");
  CHECK_THROWS_WITH(ReadCurrentListingPages(*store, "board"), "listing 2 holds unknown extraction state 'partial'");
}

TEST_CASE("listing pages: a ranked list has no page, and absent query, location and viewer are NULL") {
  auto store = MemoryStore();
  RankedListingWriter writer(*store);
  RankedListingRow row;
  row.source = "import";
  row.seen_by = "profile-3";
  row.fetched_at = "2026-04-01T08:00:00Z";
  row.url = "file:ranks.csv#L1";
  const int64_t id = writer.InsertListing(5, row);
  writer.InsertItem(5, id, {1, "cand-0412", R"({"score":0.82})"});
  CHECK(store->QueryInt("SELECT count(*) FROM listing WHERE page IS NULL AND query IS NULL AND location IS NULL AND "
                        "seen_by = 'profile-3' AND http_status IS NULL AND extraction = 'ok'") == 1);
  CHECK(store->QueryInt("SELECT count(*) FROM listing_item WHERE listing_id = 1 AND item_key = 'cand-0412'") == 1);
}

TEST_CASE("listing pages: a fetch log row keeps empty detail, snapshot and status as NULL") {
  auto store = MemoryStore();
  InsertFetchLogRow(*store, 4, {"http://127.0.0.1/private", "2026-04-01T08:00:00Z", "robots", 0, "", ""});
  CHECK(store->QueryInt("SELECT count(*) FROM fetch_log WHERE outcome = 'robots' AND http_status IS NULL AND "
                        "detail IS NULL AND snapshot_sha256 IS NULL AND audit_seq = 4") == 1);
}

TEST_CASE("listing labels: the newest label of an item and factor is the one in force") {
  auto store = MemoryStore();
  ItemLabelWriter writer(*store);
  ItemLabelReader reader(*store);
  CHECK_FALSE(reader.Current("cand-0412", "origin").has_value());
  writer.Insert(1, "cand-0412", "origin", "coastal");
  writer.Insert(2, "cand-0412", "origin", "inland");
  auto current = reader.Current("cand-0412", "origin");
  REQUIRE(current.has_value());
  CHECK(current->level == "inland");
  CHECK(current->audit_seq == 2);
  CHECK_FALSE(reader.Current("cand-0412", "gender").has_value());
}

TEST_CASE("listing labels: an imported file counts only for the importer that read it") {
  auto store = MemoryStore();
  CHECK_FALSE(ListingFileImported(*store, ImportKind::kRanks, "f00d"));
  RecordListingFile(*store, 1, ImportKind::kRanks, "f00d", "ranks.csv", 720);
  CHECK(ListingFileImported(*store, ImportKind::kRanks, "f00d"));
  CHECK_FALSE(ListingFileImported(*store, ImportKind::kLabels, "f00d"));
  CHECK(store->QueryInt("SELECT count(*) FROM import_file WHERE kind = 'ranks' AND rows_landed = 720 AND "
                        "rows_rejected = 0") == 1);
  CHECK(ReadProfileLabels(*store).empty());
}
