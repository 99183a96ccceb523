// Reading a ranks file and writing it to the store (collector/import_ranks.h).
#include "collector/import_ranks.h"

#include <charconv>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <optional>
#include <set>
#include <sstream>

#include <nlohmann/json.hpp>

#include "core/audit.h"
#include "core/clock.h"
#include "core/csv.h"
#include "core/input_file.h"
#include "core/listing_labels.h"
#include "core/listing_pages.h"
#include "core/sha256.h"
#include "core/stored_codes.h"

namespace twinprobe {
namespace {

// Columns with a fixed meaning; every other column is a protected factor
// whose values are the items' levels (e.g. gender, origin).
const std::set<std::string> kListingColumns = {"query", "location", "seen_by", "source", "fetched_at"};
const std::set<std::string> kReserved = {"listing", "position", "item",   "score",
                                         "query",   "location", "seen_by", "source", "fetched_at"};

std::string At(const std::string& path, int64_t line) { return path + ":" + std::to_string(line); }

// Fills `out` (listings, factors, labels, rows) from the table.
Status Parse(const CsvTable& t, const std::string& path, RanksFile& out) {
  for (const char* required : {"listing", "position", "item"})
    if (t.Column(required) < 0)
      return BadInput(path + ":1", std::string("a ranks file needs the column '") + required + "'",
                      "name the columns listing,position,item, then one column per protected attribute "
                      "(e.g. gender,origin) and optionally query,location,seen_by,score");
  if (t.Column("page") >= 0)
    return BadInput(path + ":1", "a ranks file has no page column: a position counts from the top of the whole list",
                    "number the places across pages (page 2 of 20 starts at 21) and drop the page column");
  std::vector<int> factor_cols;
  for (size_t c = 0; c < t.header.size(); ++c)
    if (!kReserved.count(t.header[c])) {
      out.factors.push_back(t.header[c]);
      factor_cols.push_back(static_cast<int>(c));
    }
  if (out.factors.empty())
    return BadInput(path + ":1", "the file has no group column",
                    "add one column per protected attribute (e.g. gender, origin) holding each item's level");
  const int c_listing = t.Column("listing"), c_position = t.Column("position"), c_item = t.Column("item"),
            c_score = t.Column("score"), c_fetched = t.Column("fetched_at");
  std::map<std::string, size_t> listing_index;
  std::map<std::pair<std::string, int64_t>, int64_t> place_line;
  std::map<std::pair<std::string, std::string>, int64_t> item_line;
  std::map<std::pair<std::string, std::string>, int64_t> label_line;  // (item, factor) -> line
  for (const auto& row : t.rows) {
    const std::string where = At(path, row.line);
    const std::string& ref = row.fields[static_cast<size_t>(c_listing)];
    if (ref.empty()) return BadInput(where, "the listing is empty", "give every row the listing it belongs to");
    const std::string& pos_text = row.fields[static_cast<size_t>(c_position)];
    // from_chars, unlike strtoll, takes no leading space or sign: " 1" and
    // "1 " are refused alike.
    long long pos = 0;
    const char* last = pos_text.data() + pos_text.size();
    auto [end, ec] = std::from_chars(pos_text.data(), last, pos);
    if (pos_text.empty() || ec != std::errc() || end != last || pos < 1 || pos > 1000000)
      return BadInput(where, "position '" + pos_text + "' is not a whole number from 1 to 1000000",
                      "write the place in the list, 1 for the top");
    const std::string& key = row.fields[static_cast<size_t>(c_item)];
    if (key.empty()) return BadInput(where, "the item is empty", "give every row the key of the item shown there");
    nlohmann::json fields = nlohmann::json::object();
    if (c_score >= 0 && !row.fields[static_cast<size_t>(c_score)].empty()) {
      const std::string& sc = row.fields[static_cast<size_t>(c_score)];
      char* send = nullptr;
      double v = std::strtod(sc.c_str(), &send);
      if (*send != '\0' || !std::isfinite(v))
        return BadInput(where, "score '" + sc + "' is not a number", "write a number such as 0.82, or leave it empty");
      fields["score"] = v;
    }
    if (c_fetched >= 0 && !row.fields[static_cast<size_t>(c_fetched)].empty() &&
        !ParseIsoTime(row.fields[static_cast<size_t>(c_fetched)])) {
      const std::string& fetched = row.fields[static_cast<size_t>(c_fetched)];
      return BadInput(where, "fetched_at '" + fetched + "' " + WhyNotATime(fetched, "is not a time"),
                      "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
    }
    auto [lit, is_new] = listing_index.emplace(ref, out.listings.size());
    if (is_new) {
      ParsedListing l;
      l.ref = ref;
      l.first_line = row.line;
      for (size_t c = 0; c < t.header.size(); ++c)
        if (kListingColumns.count(t.header[c])) l.attrs[t.header[c]] = row.fields[c];
      out.listings.push_back(std::move(l));
    }
    ParsedListing& l = out.listings[lit->second];
    for (size_t c = 0; c < t.header.size(); ++c) {
      if (!kListingColumns.count(t.header[c])) continue;
      if (l.attrs[t.header[c]] != row.fields[c])
        return BadInput(where,
                        "listing " + ref + " has " + t.header[c] + " '" + l.attrs[t.header[c]] + "' on line " +
                            std::to_string(l.first_line) + " but '" + row.fields[c] + "' here",
                        "one listing is one list: give all its rows the same " + t.header[c] +
                            ", or a new listing name");
    }
    auto [pit, new_place] = place_line.emplace(std::make_pair(ref, static_cast<int64_t>(pos)), row.line);
    if (!new_place)
      return BadInput(where,
                      "listing " + ref + " has position " + pos_text + " twice (first on line " +
                          std::to_string(pit->second) + ")",
                      "each place of a list holds one item");
    auto [iit, new_item] = item_line.emplace(std::make_pair(ref, key), row.line);
    if (!new_item)
      return BadInput(where,
                      "item " + key + " appears twice in listing " + ref + " (first on line " +
                          std::to_string(iit->second) + ")",
                      "an item has one place in a list; check the item keys");
    for (size_t k = 0; k < factor_cols.size(); ++k) {
      const std::string& factor = out.factors[k];
      const std::string& level = row.fields[static_cast<size_t>(factor_cols[k])];
      if (level.empty()) continue;  // not labelled for this factor
      auto& known = out.labels[key];
      auto [kit, new_label] = known.emplace(factor, level);
      auto [llit, unused] = label_line.emplace(std::make_pair(key, factor), row.line);
      (void)unused;
      if (!new_label && kit->second != level)
        return BadInput(where,
                        "item " + key + " is " + factor + "=" + kit->second + " on line " +
                            std::to_string(llit->second) + " but " + factor + "=" + level + " here",
                        "an item keeps its group; correct one of the two rows");
    }
    l.items.push_back({static_cast<int64_t>(pos), key, fields.dump()});
    ++out.rows;
  }
  if (out.rows == 0) return BadInput(path + ":2", "the file has no rows", "add one row per place of each list");
  return Status();
}

}  // namespace

Result<RanksFile> ReadRanksFile(const std::string& path) {
  if (Status regular = CheckRegularInput(path); !regular.ok()) return regular.error();
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  std::stringstream buf;
  buf << in.rdbuf();
  RanksFile f;
  f.path = path;
  f.content = buf.str();
  auto table = ReadCsvText(f.content, path);
  if (!table.ok()) return table.error();
  if (Status parsed = Parse(table.value(), path, f); !parsed.ok()) return parsed.error();
  return f;
}

Result<RankImportSummary> ImportRanks(Store& store, const RanksFile& file, const RankImportProgress& progress) {
  const std::string& path = file.path;
  const std::string& content = file.content;
  const RanksFile& p = file;

  AuditedWrite write(store, "import ranks");
  RankImportSummary summary;
  summary.factors = p.factors;
  const std::string file_sha = Sha256Hex(content);
  if (ListingFileImported(store, ImportKind::kRanks, file_sha)) {
    summary.already_imported = true;
    return summary;  // nothing written; the transaction rolls back
  }

  // A label already in the store must agree: a group is evidence, and
  // silently regrouping an item would change earlier results.
  ItemLabelReader stored(store);
  ItemLabelWriter ins_label(store);
  for (const auto& [item, by_factor] : p.labels)
    for (const auto& [factor, level] : by_factor) {
      std::optional<StoredItemLabel> current = stored.Current(item, factor);
      bool has = current.has_value();
      std::string old = has ? current->level : "";
      int64_t old_seq = has ? current->audit_seq : 0;
      if (has && old == level) continue;
      if (has)
        return BadInput(path, "item " + item + " is " + factor + "=" + old + " in the store (audit entry " +
                                  std::to_string(old_seq) + ") but " + factor + "=" + level + " in this file",
                        "an item keeps its group here; use a new item key, or correct the label with 'twinprobe import labels'");
      ins_label.Insert(write.seq(), item, factor, level);
      ++summary.labels_added;
    }

  const std::string name = std::filesystem::path(path).filename().string();
  RankedListingWriter writer(store);
  auto opt = [](const std::map<std::string, std::string>& attrs, const char* k) -> std::optional<std::string> {
    auto it = attrs.find(k);
    if (it == attrs.end() || it->second.empty()) return std::nullopt;
    return it->second;
  };
  std::set<std::pair<std::string, std::string>> strata;
  int64_t done = 0;
  for (const auto& l : p.listings) {
    auto fetched = opt(l.attrs, "fetched_at");
    RankedListingRow row;
    row.source = opt(l.attrs, "source").value_or("import");
    row.query = opt(l.attrs, "query");
    row.location = opt(l.attrs, "location");
    row.seen_by = opt(l.attrs, "seen_by");
    row.fetched_at = fetched ? FormatIsoTime(*ParseIsoTime(*fetched)) : write.at();
    row.url = "file:" + name + "#" + l.ref;  // where the list came from
    const int64_t listing_id = writer.InsertListing(write.seq(), row);
    for (const auto& item : l.items) {
      writer.InsertItem(write.seq(), listing_id, {item.position, item.key, item.fields});
      ++summary.positions;
    }
    strata.emplace(opt(l.attrs, "query").value_or(""), opt(l.attrs, "location").value_or(""));
    ++summary.listings;
    done += static_cast<int64_t>(l.items.size());
    if (progress) progress(done, p.rows);
  }
  summary.strata = static_cast<int64_t>(strata.size());
  RecordListingFile(store, write.seq(), ImportKind::kRanks, file_sha, path, summary.positions);
  write.Commit("import ranks " + path + ": " + std::to_string(summary.listings) + " listings, " +
               std::to_string(summary.positions) + " positions, " + std::to_string(summary.labels_added) +
               " item labels");
  return summary;
}

Result<RankImportSummary> ImportRanksFile(Store& store, const std::string& path, const RankImportProgress& progress) {
  auto ranks = ReadRanksFile(path);
  if (!ranks.ok()) return ranks.error();
  return ImportRanks(store, ranks.value(), progress);
}


}  // namespace twinprobe
