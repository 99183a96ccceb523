#include "core/near_duplicates.h"

#include <algorithm>

#include "core/text.h"

namespace twinprobe {

std::string SpellingKey(std::string_view value) {
  std::string key;
  bool space = false;
  for (char c : Lower(Trim(value))) {
    const bool is_space = c == ' ' || c == '\t' || c == '\n' || c == '\v' || c == '\f' || c == '\r';
    if (is_space) {
      space = true;
      continue;
    }
    if (space) key += ' ';
    space = false;
    key += c;
  }
  return key;
}

void SpellingTally::Add(const std::string& column, const std::string& value, int64_t count) {
  auto [c, new_column] = column_index_.try_emplace(column, columns_.size());
  if (new_column) columns_.push_back(Column{column, {}, {}});
  Column& col = columns_[c->second];
  auto [v, new_value] = col.index.try_emplace(value, col.values.size());
  if (new_value) col.values.push_back(Spelling{value, 0});
  col.values[v->second].count += count;
}

std::vector<NearDuplicate> SpellingTally::NearDuplicates() const {
  std::vector<NearDuplicate> out;
  for (const Column& col : columns_) {
    // Group by key in the order each key's first spelling was seen.
    std::vector<std::string> keys;
    std::map<std::string, std::vector<Spelling>> groups;
    for (const Spelling& s : col.values) {
      std::string key = SpellingKey(s.text);
      auto [g, inserted] = groups.try_emplace(key);
      if (inserted) keys.push_back(key);
      g->second.push_back(s);
    }
    for (const std::string& key : keys) {
      std::vector<Spelling>& group = groups[key];
      if (group.size() < 2) continue;
      std::stable_sort(group.begin(), group.end(),
                       [](const Spelling& a, const Spelling& b) { return a.count > b.count; });
      out.push_back(NearDuplicate{col.name, std::move(group)});
    }
  }
  return out;
}

}  // namespace twinprobe
