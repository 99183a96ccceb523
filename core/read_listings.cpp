#include "core/read_listings.h"

#include <algorithm>
#include <map>
#include <tuple>

#include "core/store.h"

namespace twinprobe {

ListingData ReadListings(Store& store) {
  ListingData d;
  d.stored_rows = store.QueryInt("SELECT count(*) FROM listing");
  std::map<std::string, int32_t> item_index;
  std::map<std::pair<std::string, std::string>, int32_t> stratum_index;
  // Which stored rows make up a list, and where each starts. A fetched list
  // of several pages is stored as one row per page, positions counting from
  // 1 on each page; its pages (same source, query, location, profile and
  // fetch command) are joined in page order, each offset by the places
  // before it. A list stops at its first missing or failed page: places
  // after a gap are unknown. Rows without a page number (import ranks) are
  // whole lists. Replaced rows (fetch --replay) are left out.
  struct Part {
    int32_t list = -1;
    int64_t offset = 0;
  };
  std::map<int64_t, Part> part_of;  // listing row id -> list and offset
  {
    struct Meta {
      int64_t id, page, max_position;
      bool ok;
    };
    std::map<std::tuple<std::string, std::string, std::string, std::string, int64_t>, std::vector<Meta>> paged;
    std::vector<std::tuple<int64_t, std::string, std::string, std::string>> whole;  // id, query, location, seen_by
    Stmt m = store.Prepare(
        "SELECT l.id, l.source, coalesce(l.query, ''), coalesce(l.location, ''), coalesce(l.seen_by, ''), l.page, "
        "  l.audit_seq, l.extraction = 'ok', (SELECT max(position) FROM listing_item i WHERE i.listing_id = l.id) "
        "FROM current_listing l ORDER BY l.id");
    while (m.Step()) {
      if (m.IsNull(5)) {
        if (m.Int(7) != 0) whole.emplace_back(m.Int(0), m.Text(2), m.Text(3), m.Text(4));
        continue;
      }
      paged[{m.Text(1) + "\n" + m.Text(2), m.Text(3), m.Text(4), "", m.Int(6)}].push_back(
          {m.Int(0), m.Int(5), m.IsNull(8) ? 0 : m.Int(8), m.Int(7) != 0});
    }
    auto add_list = [&](const std::string& query, const std::string& location, const std::string& seen_by) {
      auto [sit, new_stratum] = stratum_index.emplace(std::make_pair(query, location), static_cast<int32_t>(d.strata.size()));
      if (new_stratum) d.strata.push_back({query, location});
      d.listings.push_back({sit->second, seen_by, {}});
      return static_cast<int32_t>(d.listings.size() - 1);
    };
    for (const auto& [id, query, location, seen_by] : whole) part_of[id] = {add_list(query, location, seen_by), 0};
    for (auto& [key, pages] : paged) {
      std::sort(pages.begin(), pages.end(), [](const Meta& a, const Meta& b) { return a.page < b.page; });
      const std::string& source_query = std::get<0>(key);
      const std::string query = source_query.substr(source_query.find('\n') + 1);
      int32_t list = -1;
      int64_t offset = 0, expected = 1;
      for (const auto& pg : pages) {
        if (pg.page != expected || !pg.ok) break;
        if (list < 0) list = add_list(query, std::get<1>(key), std::get<2>(key));
        part_of[pg.id] = {list, offset};
        offset += pg.max_position;
        ++expected;
      }
    }
  }
  Stmt q = store.Prepare("SELECT listing_id, position, item_key FROM listing_item ORDER BY listing_id, position, id");
  while (q.Step()) {
    auto pit = part_of.find(q.Int(0));
    if (pit == part_of.end()) continue;
    std::string key = q.Text(2);
    auto [iit, new_item] = item_index.emplace(key, static_cast<int32_t>(d.item_keys.size()));
    if (new_item) d.item_keys.push_back(key);
    const int32_t list = pit->second.list;
    d.listings[static_cast<size_t>(list)].appearances.push_back(static_cast<int32_t>(d.appearances.size()));
    d.appearances.push_back({list, static_cast<int32_t>(pit->second.offset + q.Int(1)), iit->second});
  }
  // Lists whose every page held no item are dropped.
  {
    std::vector<ListingList> kept;
    std::vector<int32_t> new_index(d.listings.size(), -1);
    for (size_t i = 0; i < d.listings.size(); ++i)
      if (!d.listings[i].appearances.empty()) {
        new_index[i] = static_cast<int32_t>(kept.size());
        kept.push_back(std::move(d.listings[i]));
      }
    for (auto& a : d.appearances) a.listing = new_index[static_cast<size_t>(a.listing)];
    d.listings = std::move(kept);
  }

  // Newest label of each item per factor (labels are append-only; a later
  // row corrects an earlier one).
  std::map<std::string, std::map<std::string, std::string>> label;  // factor -> item -> level
  Stmt l = store.Prepare("SELECT item_key, factor, level FROM item_label ORDER BY id");
  while (l.Step()) label[l.Text(1)][l.Text(0)] = l.Text(2);

  // Appearances per level decide the reference when the plan has none.
  std::map<std::string, std::string> plan_reference;
  Stmt r = store.Prepare(
      "SELECT f.name, l.name FROM level l JOIN factor f ON f.id = l.factor_id "
      "WHERE l.is_reference = 1 AND f.plan_id = (SELECT max(id) FROM plan)");
  while (r.Step()) plan_reference[r.Text(0)] = r.Text(1);

  d.item_level.assign(d.item_keys.size(), {});
  for (const auto& [factor, by_item] : label) {
    std::map<std::string, int64_t> count;
    for (const auto& a : d.appearances) {
      auto it = by_item.find(d.item_keys[static_cast<size_t>(a.item)]);
      if (it != by_item.end() && !it->second.empty()) ++count[it->second];
    }
    if (count.empty()) continue;
    std::vector<std::string> levels;
    for (const auto& [level, n] : count) levels.push_back(level);
    std::string reference = levels.front();
    auto pr = plan_reference.find(factor);
    if (pr != plan_reference.end() && count.count(pr->second)) {
      reference = pr->second;
    } else {
      for (const auto& [level, n] : count)
        if (n > count[reference]) reference = level;
    }
    levels.erase(std::find(levels.begin(), levels.end(), reference));
    levels.insert(levels.begin(), reference);
    const size_t f = d.factors.size();
    d.factors.push_back(factor);
    d.levels.push_back(levels);
    for (size_t i = 0; i < d.item_keys.size(); ++i) {
      d.item_level[i].resize(f + 1, -1);
      auto it = by_item.find(d.item_keys[i]);
      if (it == by_item.end()) continue;
      auto lv = std::find(levels.begin(), levels.end(), it->second);
      if (lv != levels.end()) d.item_level[i][f] = static_cast<int32_t>(lv - levels.begin());
    }
  }
  for (auto& v : d.item_level) v.resize(d.factors.size(), -1);
  return d;
}

}  // namespace twinprobe
