#include "collector/listing_store.h"

#include <nlohmann/json.hpp>

namespace twinprobe {
namespace {

void BindText(Stmt& s, int index, const std::string& value) {
  if (value.empty()) s.BindNull(index);
  else s.Bind(index, value);
}

}  // namespace

std::string FieldsJson(const ExtractedItem& item) {
  nlohmann::json j = nlohmann::json::object();
  for (const auto& [name, value] : item.fields) j[name] = value;
  return j.dump();
}

int64_t InsertListing(Store& store, int64_t seq, const ListingRow& row, const Extraction& x) {
  Stmt ins = store.Prepare(
      "INSERT INTO listing(source, query, location, page, fetched_at, url, http_status, snapshot_sha256, extraction, "
      "extraction_error, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11)");
  ins.Bind(1, row.source);
  BindText(ins, 2, row.query);
  BindText(ins, 3, row.location);
  ins.Bind(4, row.page).Bind(5, row.fetched_at).Bind(6, row.url);
  if (row.http_status) ins.Bind(7, row.http_status);
  else ins.BindNull(7);
  ins.Bind(8, row.snapshot_sha256).Bind(9, x.ok ? "ok" : "failed");
  BindText(ins, 10, x.ok ? std::string() : x.error);
  ins.Bind(11, seq).Run();
  int64_t id = store.LastInsertId();
  if (!x.ok) return id;
  Stmt item = store.Prepare(
      "INSERT INTO listing_item(listing_id, position, item_key, fields, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)");
  for (const ExtractedItem& it : x.items) {
    item.Bind(1, id).Bind(2, it.position).Bind(3, it.key).Bind(4, FieldsJson(it)).Bind(5, seq);
    item.Run();
  }
  return id;
}

void InsertFetchLog(Store& store, int64_t seq, const FetchLogEntry& e) {
  Stmt ins = store.Prepare(
      "INSERT INTO fetch_log(url, at, outcome, http_status, detail, snapshot_sha256, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)");
  ins.Bind(1, e.url).Bind(2, e.at).Bind(3, e.outcome);
  if (e.http_status) ins.Bind(4, e.http_status);
  else ins.BindNull(4);
  BindText(ins, 5, e.detail);
  BindText(ins, 6, e.snapshot_sha256);
  ins.Bind(7, seq).Run();
}

void InsertReplay(Store& store, int64_t seq, int64_t new_id, int64_t replaced_id) {
  Stmt ins = store.Prepare("INSERT INTO listing_replay(listing_id, replaces, audit_seq) VALUES (?1, ?2, ?3)");
  ins.Bind(1, new_id).Bind(2, replaced_id).Bind(3, seq).Run();
}

std::vector<StoredListing> CurrentListings(Store& store, const std::string& source) {
  Stmt q = store.Prepare(
      "SELECT id, source, coalesce(query, ''), coalesce(location, ''), coalesce(page, 1), fetched_at, "
      "coalesce(url, ''), coalesce(http_status, 0), coalesce(snapshot_sha256, ''), extraction, "
      "coalesce(extraction_error, '') FROM current_listing WHERE source = ?1 ORDER BY id");
  q.Bind(1, source);
  std::vector<StoredListing> out;
  while (q.Step()) {
    StoredListing s;
    s.id = q.Int(0);
    s.row = ListingRow{q.Text(1),
                       q.Text(2),
                       q.Text(3),
                       static_cast<int>(q.Int(4)),
                       q.Text(5),
                       q.Text(6),
                       static_cast<int>(q.Int(7)),
                       q.Text(8),
                       q.Text(9) == "ok",
                       q.Text(10)};
    out.push_back(std::move(s));
  }
  return out;
}

std::string ExtractionFingerprint(const Extraction& x) {
  nlohmann::json j{{"ok", x.ok}, {"error", x.ok ? "" : x.error}, {"items", nlohmann::json::array()}};
  if (x.ok)
    for (const auto& it : x.items)
      j["items"].push_back({it.position, it.key, nlohmann::json::parse(FieldsJson(it))});
  return j.dump();
}

std::string StoredFingerprint(Store& store, int64_t listing_id) {
  Stmt l = store.Prepare("SELECT extraction, coalesce(extraction_error, '') FROM listing WHERE id = ?1");
  l.Bind(1, listing_id);
  if (!l.Step()) return {};
  bool ok = l.Text(0) == "ok";
  nlohmann::json j{{"ok", ok}, {"error", ok ? "" : l.Text(1)}, {"items", nlohmann::json::array()}};
  Stmt items = store.Prepare("SELECT position, item_key, fields FROM listing_item WHERE listing_id = ?1 ORDER BY position");
  items.Bind(1, listing_id);
  while (items.Step()) j["items"].push_back({items.Int(0), items.Text(1), nlohmann::json::parse(items.Text(2))});
  return j.dump();
}

}  // namespace twinprobe
