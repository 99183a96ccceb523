// `twinprobe import ranks FILE.csv`: ranked lists with the group of each item
// (a listing audit), into the store's listing, listing_item and item_label
// tables in one audited write. Works in a folder without a design: the
// store is created when missing. Manual: docs/ranks.md.
#include <charconv>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <optional>
#include <set>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/import_ranks_cmd.h"

#include "analysis/listing_analysis.h"
#include "cli/command.h"
#include "core/audit.h"
#include "core/clock.h"
#include "core/csv.h"
#include "core/sha256.h"

namespace twinprobe {
namespace {

// Columns with a fixed meaning; every other column is a protected factor
// whose values are the items' levels (e.g. gender, origin).
const std::set<std::string> kListingColumns = {"query", "location", "seen_by", "source", "fetched_at"};
const std::set<std::string> kReserved = {"listing", "position", "item",   "score",
                                         "query",   "location", "seen_by", "source", "fetched_at"};

struct ParsedListing {
  std::string ref;
  std::map<std::string, std::string> attrs;  // listing-level columns as given
  int64_t first_line = 0;
  struct Item {
    int64_t position;
    std::string key;
    std::string fields;  // JSON
  };
  std::vector<Item> items;
};

struct ParsedFile {
  std::vector<ParsedListing> listings;
  std::vector<std::string> factors;
  std::map<std::string, std::map<std::string, std::string>> labels;  // item -> factor -> level
  int64_t rows = 0;
};

std::string At(const std::string& path, int64_t line) { return path + ":" + std::to_string(line); }

Result<ParsedFile> Parse(const CsvTable& t, const std::string& path) {
  for (const char* required : {"listing", "position", "item"})
    if (t.Column(required) < 0)
      return BadInput(path + ":1", std::string("a ranks file needs the column '") + required + "'",
                      "name the columns listing,position,item, then one column per protected attribute "
                      "(e.g. gender,origin) and optionally query,location,seen_by,score");
  if (t.Column("page") >= 0)
    return BadInput(path + ":1", "a ranks file has no page column: a position counts from the top of the whole list",
                    "number the places across pages (page 2 of 20 starts at 21) and drop the page column");
  ParsedFile out;
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
        !ParseIsoTime(row.fields[static_cast<size_t>(c_fetched)]))
      return BadInput(where, "fetched_at '" + row.fields[static_cast<size_t>(c_fetched)] + "' is not a time",
                      "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
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
  return out;
}

struct RanksFile {
  std::string path;
  std::string content;  // hashed so that a second import of the same bytes adds nothing
  ParsedFile parsed;
};

// Reads and checks the whole file before the store is touched (or created).
Result<RanksFile> ReadRanksFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  std::stringstream buf;
  buf << in.rdbuf();
  RanksFile f{path, buf.str(), {}};
  auto table = ReadCsvText(f.content, path);
  if (!table.ok()) return table.error();
  auto parsed = Parse(table.value(), path);
  if (!parsed.ok()) return parsed.error();
  f.parsed = std::move(parsed.value());
  return f;
}

Result<RankImportSummary> ImportRanks(Store& store, const RanksFile& file) {
  const std::string& path = file.path;
  const std::string& content = file.content;
  const ParsedFile& p = file.parsed;

  AuditedWrite write(store, "import ranks");
  RankImportSummary summary;
  summary.factors = p.factors;
  const std::string file_sha = Sha256Hex(content);
  Stmt seen = store.Prepare("SELECT count(*) FROM import_file WHERE kind = 'ranks' AND sha256 = ?1");
  seen.Bind(1, file_sha);
  if (seen.Step() && seen.Int(0) > 0) {
    summary.already_imported = true;
    return summary;  // nothing written; the transaction rolls back
  }

  // A label already in the store must agree: a group is evidence, and
  // silently regrouping an item would change earlier results.
  Stmt stored = store.Prepare(
      "SELECT level, audit_seq FROM item_label WHERE item_key = ?1 AND factor = ?2 ORDER BY id DESC LIMIT 1");
  Stmt ins_label = store.Prepare("INSERT INTO item_label(item_key, factor, level, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  for (const auto& [item, by_factor] : p.labels)
    for (const auto& [factor, level] : by_factor) {
      stored.Bind(1, item).Bind(2, factor);
      bool has = stored.Step();
      std::string old = has ? stored.Text(0) : "";
      int64_t old_seq = has ? stored.Int(1) : 0;
      stored.Reset();
      if (has && old == level) continue;
      if (has)
        return BadInput(path, "item " + item + " is " + factor + "=" + old + " in the store (audit entry " +
                                  std::to_string(old_seq) + ") but " + factor + "=" + level + " in this file",
                        "an item keeps its group here; use a new item key, or correct the label with 'twinprobe import labels'");
      ins_label.Bind(1, item).Bind(2, factor).Bind(3, level).Bind(4, write.seq()).Run();
      ++summary.labels_added;
    }

  const std::string name = std::filesystem::path(path).filename().string();
  Stmt ins_listing = store.Prepare(
      "INSERT INTO listing(source, query, location, page, seen_by, fetched_at, url, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8)");
  Stmt ins_item = store.Prepare(
      "INSERT INTO listing_item(listing_id, position, item_key, fields, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)");
  auto opt = [](const std::map<std::string, std::string>& attrs, const char* k) -> std::optional<std::string> {
    auto it = attrs.find(k);
    if (it == attrs.end() || it->second.empty()) return std::nullopt;
    return it->second;
  };
  stats::ProgressFn progress = TerminalProgress("import ranks");
  std::set<std::pair<std::string, std::string>> strata;
  int64_t done = 0;
  for (const auto& l : p.listings) {
    auto fetched = opt(l.attrs, "fetched_at");
    ins_listing.Bind(1, opt(l.attrs, "source").value_or("import"))
        .Bind(2, opt(l.attrs, "query"))
        .Bind(3, opt(l.attrs, "location"));
    ins_listing.BindNull(4);  // positions are places in the whole list (no pages)
    ins_listing.Bind(5, opt(l.attrs, "seen_by"))
        .Bind(6, fetched ? FormatIsoTime(*ParseIsoTime(*fetched)) : write.at())
        .Bind(7, "file:" + name + "#" + l.ref)  // where the list came from
        .Bind(8, write.seq())
        .Run();
    const int64_t listing_id = store.LastInsertId();
    for (const auto& item : l.items) {
      ins_item.Bind(1, listing_id).Bind(2, item.position).Bind(3, item.key).Bind(4, item.fields).Bind(5, write.seq()).Run();
      ++summary.positions;
    }
    strata.emplace(opt(l.attrs, "query").value_or(""), opt(l.attrs, "location").value_or(""));
    ++summary.listings;
    done += static_cast<int64_t>(l.items.size());
    if (progress) progress(done, p.rows);
  }
  summary.strata = static_cast<int64_t>(strata.size());
  Stmt ins_file = store.Prepare(
      "INSERT INTO import_file(kind, sha256, path, rows_landed, rows_rejected, audit_seq) VALUES ('ranks', ?1, ?2, ?3, 0, ?4)");
  ins_file.Bind(1, file_sha).Bind(2, path).Bind(3, summary.positions).Bind(4, write.seq()).Run();
  write.Commit("import ranks " + path + ": " + std::to_string(summary.listings) + " listings, " +
               std::to_string(summary.positions) + " positions, " + std::to_string(summary.labels_added) +
               " item labels");
  return summary;
}

}  // namespace

Result<RankImportSummary> ImportRanksFile(Store& store, const std::string& path) {
  auto ranks = ReadRanksFile(path);
  if (!ranks.ok()) return ranks.error();
  return ImportRanks(store, ranks.value());
}

namespace {

int RunImportRanks(Context& ctx, const std::string& file) {
  auto ranks = ReadRanksFile(file);
  if (!ranks.ok()) return ReportError(ranks.error());
  auto store = OpenStudyStore(ctx, true);
  if (!store.ok()) return ReportError(store.error());
  auto r = ImportRanks(*store.value(), ranks.value());
  if (!r.ok()) return ReportError(r.error());
  const auto& s = r.value();
  if (ctx.json) {
    std::cout << nlohmann::json{{"file", file},
                                {"already_imported", s.already_imported},
                                {"listings", s.listings},
                                {"positions", s.positions},
                                {"labels_added", s.labels_added},
                                {"strata", s.strata},
                                {"factors", s.factors}}
                     .dump(2)
              << "\n";
  } else if (s.already_imported) {
    std::cout << "This file was imported before; nothing was added.\n";
  } else {
    std::string factors;
    for (const auto& f : s.factors) factors += (factors.empty() ? "" : ", ") + f;
    std::cout << "Imported " << s.listings << " listings (" << s.positions << " positions, " << s.strata
              << " query x location strata) from " << file << "; " << s.labels_added << " item labels by "
              << factors << ".\nRun 'twinprobe analyze' for the listing audit.\n";
  }
  return 0;
}

}  // namespace

void AddImportRanks(CLI::App& import, Context& ctx) {
  auto file = std::make_shared<std::string>();
  auto* ranks = import.add_subcommand(
      "ranks",
      "Import ranked lists for a listing audit: columns listing,position,item, one column per protected "
      "attribute (e.g. gender,origin), optionally query,location,seen_by,score; all or nothing");
  ranks->add_option("file", *file, "CSV file")->required();
  ranks->callback([&ctx, file] { ctx.exit_code = RunImportRanks(ctx, *file); });
}

}  // namespace twinprobe
