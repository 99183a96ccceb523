#include "core/listing_pages.h"

namespace twinprobe {
namespace {

void BindText(Stmt& s, int index, const std::string& value) {
  if (value.empty())
    s.BindNull(index);
  else
    s.Bind(index, value);
}

ExtractionState ExtractionFrom(const std::string& text, int64_t listing_id) {
  std::optional<ExtractionState> state = ParseExtractionState(text);
  // Only a newer twinprobe (or a hand edit) writes another spelling.
  if (!state)
    throw StoreError("listing " + std::to_string(listing_id) + " holds unknown extraction state '" + text + "'");
  return *state;
}

}  // namespace

int64_t InsertListingPage(Store& store, int64_t seq, const ListingPageRow& row,
                          const std::vector<ListingItemRow>& items) {
  const bool ok = row.extraction == ExtractionState::kOk;
  Stmt ins = store.Prepare(
      "INSERT INTO listing(source, query, location, page, fetched_at, url, http_status, snapshot_sha256, extraction, "
      "extraction_error, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11)");
  ins.Bind(1, row.source);
  BindText(ins, 2, row.query);
  BindText(ins, 3, row.location);
  ins.Bind(4, row.page).Bind(5, row.fetched_at).Bind(6, row.url);
  if (row.http_status)
    ins.Bind(7, row.http_status);
  else
    ins.BindNull(7);
  ins.Bind(8, row.snapshot_sha256).Bind(9, ExtractionStateName(row.extraction));
  BindText(ins, 10, ok ? std::string() : row.extraction_error);
  ins.Bind(11, seq).Run();
  const int64_t id = store.LastInsertId();
  if (items.empty()) return id;
  Stmt item = store.Prepare(
      "INSERT INTO listing_item(listing_id, position, item_key, fields, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)");
  for (const ListingItemRow& it : items)
    item.Bind(1, id).Bind(2, it.position).Bind(3, it.item_key).Bind(4, it.fields_json).Bind(5, seq).Run();
  return id;
}

RankedListingWriter::RankedListingWriter(Store& store)
    : store_(store),
      listing_(store.Prepare("INSERT INTO listing(source, query, location, page, seen_by, fetched_at, url, audit_seq) "
                             "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8)")),
      item_(store.Prepare(
          "INSERT INTO listing_item(listing_id, position, item_key, fields, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)")) {}

int64_t RankedListingWriter::InsertListing(int64_t seq, const RankedListingRow& row) {
  listing_.Bind(1, row.source).Bind(2, row.query).Bind(3, row.location);
  listing_.BindNull(4);  // positions are places in the whole list (no pages)
  listing_.Bind(5, row.seen_by).Bind(6, row.fetched_at).Bind(7, row.url).Bind(8, seq).Run();
  return store_.LastInsertId();
}

void RankedListingWriter::InsertItem(int64_t seq, int64_t listing_id, const ListingItemRow& item) {
  item_.Bind(1, listing_id).Bind(2, item.position).Bind(3, item.item_key).Bind(4, item.fields_json).Bind(5, seq).Run();
}

void InsertFetchLogRow(Store& store, int64_t seq, const FetchLogRow& e) {
  Stmt ins = store.Prepare(
      "INSERT INTO fetch_log(url, at, outcome, http_status, detail, snapshot_sha256, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)");
  ins.Bind(1, e.url).Bind(2, e.at).Bind(3, e.outcome);
  if (e.http_status)
    ins.Bind(4, e.http_status);
  else
    ins.BindNull(4);
  BindText(ins, 5, e.detail);
  BindText(ins, 6, e.snapshot_sha256);
  ins.Bind(7, seq).Run();
}

void InsertListingReplay(Store& store, int64_t seq, int64_t new_id, int64_t replaced_id) {
  Stmt ins = store.Prepare("INSERT INTO listing_replay(listing_id, replaces, audit_seq) VALUES (?1, ?2, ?3)");
  ins.Bind(1, new_id).Bind(2, replaced_id).Bind(3, seq).Run();
}

std::vector<StoredListingPage> ReadCurrentListingPages(Store& store, const std::string& source) {
  Stmt q = store.Prepare(
      "SELECT id, source, coalesce(query, ''), coalesce(location, ''), coalesce(page, 1), fetched_at, "
      "coalesce(url, ''), coalesce(http_status, 0), coalesce(snapshot_sha256, ''), extraction, "
      "coalesce(extraction_error, '') FROM current_listing WHERE source = ?1 ORDER BY id");
  q.Bind(1, source);
  std::vector<StoredListingPage> out;
  while (q.Step()) {
    StoredListingPage s;
    s.id = q.Int(0);
    s.row = ListingPageRow{q.Text(1),
                           q.Text(2),
                           q.Text(3),
                           static_cast<int>(q.Int(4)),
                           q.Text(5),
                           q.Text(6),
                           static_cast<int>(q.Int(7)),
                           q.Text(8),
                           ExtractionFrom(q.Text(9), s.id),
                           q.Text(10)};
    out.push_back(std::move(s));
  }
  return out;
}

std::optional<StoredExtraction> ReadStoredExtraction(Store& store, int64_t listing_id) {
  Stmt l = store.Prepare("SELECT extraction, coalesce(extraction_error, '') FROM listing WHERE id = ?1");
  l.Bind(1, listing_id);
  if (!l.Step()) return std::nullopt;
  StoredExtraction out;
  out.extraction = ExtractionFrom(l.Text(0), listing_id);
  out.error = l.Text(1);
  Stmt items =
      store.Prepare("SELECT position, item_key, fields FROM listing_item WHERE listing_id = ?1 ORDER BY position");
  items.Bind(1, listing_id);
  while (items.Step()) out.items.push_back({items.Int(0), items.Text(1), items.Text(2)});
  return out;
}

}  // namespace twinprobe
