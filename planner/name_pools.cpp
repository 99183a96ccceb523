#include "planner/name_pools.h"

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <set>

#include "core/csv.h"

namespace twinprobe {

bool IsFieldName(const std::string& name) {
  if (name.empty() || !(std::isalpha(static_cast<unsigned char>(name[0])) || name[0] == '_')) return false;
  return std::all_of(name.begin(), name.end(),
                     [](char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_'; });
}

const std::vector<std::string>& IdentityFields() {
  static const std::vector<std::string> fields = {"given_name", "family_name", "full_name", "mailbox", "phone"};
  return fields;
}

Result<std::vector<NameList>> ReadNamePools(const std::string& study_dir, const Design& design) {
  std::vector<NameList> pools;
  for (const auto& np : design.name_pools) {
    std::string path = (std::filesystem::path(study_dir) / np.file).string();
    auto t = ReadCsvFile(path);
    if (!t.ok()) return t.error();
    const CsvTable& table = t.value();
    int g = table.Column("given_name"), f = table.Column("family_name");
    if (g < 0 || f < 0)
      return BadInput(path + ":1", "a name pool needs the columns given_name and family_name", "add them");
    NameList list;
    list.file = np.file;
    list.path = path;
    std::vector<int> extra_cols;
    for (size_t c = 0; c < table.header.size(); ++c) {
      if (static_cast<int>(c) == g || static_cast<int>(c) == f) continue;
      const std::string& name = table.header[c];
      if (!IsFieldName(name))
        return BadInput(path + ":1", "the column '" + name + "' is not usable as a template field",
                        "name it with letters, digits and '_' (starting with a letter)");
      const auto& reserved = IdentityFields();
      if (std::find(reserved.begin(), reserved.end(), name) != reserved.end())
        return BadInput(path + ":1", "the column '" + name + "' is reserved: twinprobe derives it from the name",
                        "remove the column or rename it");
      for (const auto& factor : design.factors)
        if (factor.fields.count(name))
          return BadInput(path + ":1", "the column '" + name + "' is also set by factor '" + factor.name + "'",
                          "remove the column or rename it");
      list.extra_columns.push_back(name);
      extra_cols.push_back(static_cast<int>(c));
    }
    std::set<std::string> seen;
    for (const auto& row : table.rows) {
      if (row.fields[g].empty() || row.fields[f].empty())
        return BadInput(path + ":" + std::to_string(row.line), "a name is empty", "fill in both parts or remove the row");
      std::string full = row.fields[g] + " " + row.fields[f];
      if (!seen.insert(full).second)
        return BadInput(path + ":" + std::to_string(row.line), "the name '" + full + "' appears twice", "remove the duplicate");
      list.names.emplace_back(row.fields[g], row.fields[f]);
      std::vector<std::string> values;
      for (int c : extra_cols) values.push_back(row.fields[c]);
      list.extra.push_back(std::move(values));
      list.lines.push_back(row.line);
    }
    if (list.names.empty()) return BadInput(path, "the name pool is empty", "add at least one name");
    pools.push_back(std::move(list));
  }
  return pools;
}

}  // namespace twinprobe
