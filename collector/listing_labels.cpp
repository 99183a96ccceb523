#include "collector/listing_labels.h"

#include <algorithm>
#include <fstream>
#include <set>
#include <sstream>

#include "core/audit.h"
#include "core/csv.h"
#include "core/input_file.h"
#include "core/listing_labels.h"
#include "core/sha256.h"
#include "core/suggest.h"

namespace twinprobe {

Result<LabelImport> ImportLabels(Store& store, const Design* design, const std::string& path) {
  if (Status regular = CheckRegularInput(path); !regular.ok()) return regular.error();
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  std::stringstream buf;
  buf << in.rdbuf();
  const std::string content = buf.str();
  auto table = ReadCsvText(content, path);
  if (!table.ok()) return table.error();
  const CsvTable& t = table.value();
  int key_col = t.Column("item_key");
  if (key_col < 0)
    return BadInput(path + ":1", "a labels file needs the column 'item_key'",
                    "name the columns item_key,FACTOR[,FACTOR…], e.g. item_key,origin");
  if (t.header.size() < 2)
    return BadInput(path + ":1", "a labels file needs at least one factor column besides item_key",
                    "add a column per factor, e.g. origin");
  std::vector<std::string> factor_names;
  if (design)
    for (const auto& f : design->factors) factor_names.push_back(f.name);
  for (size_t c = 0; c < t.header.size(); ++c) {
    if (static_cast<int>(c) == key_col) continue;
    const std::string& h = t.header[c];
    if (h.empty()) return BadInput(path + ":1", "column " + std::to_string(c + 1) + " has no name", "name every column");
    if (!factor_names.empty() && std::find(factor_names.begin(), factor_names.end(), h) == factor_names.end())
      return BadInput(path + ":1", "'" + h + "' is not a factor of this study" + DidYouMean(h, factor_names),
                      "name the columns after the design's [[factor]] names");
  }
  AuditedWrite write(store, "import labels");
  LabelImport out;
  const std::string sha = Sha256Hex(content);
  if (ListingFileImported(store, ImportKind::kLabels, sha)) {
    out.already_imported = true;
    return out;
  }
  ItemLabelWriter labels(store);
  std::set<std::string> keys;
  for (const CsvRecord& row : t.rows) {
    const std::string where = path + ":" + std::to_string(row.line);
    const std::string& key = row.fields[key_col];
    if (key.empty()) return BadInput(where, "item_key is empty", "give every row the key of its item");
    if (!keys.insert(key).second)
      return BadInput(where, "item key '" + key + "' is labelled twice in this file", "keep one row per item");
    for (size_t c = 0; c < t.header.size(); ++c) {
      if (static_cast<int>(c) == key_col || row.fields[c].empty()) continue;
      const std::string& factor = t.header[c];
      const std::string& level = row.fields[c];
      if (design) {
        auto f = std::find_if(design->factors.begin(), design->factors.end(),
                              [&](const Factor& x) { return x.name == factor; });
        if (f != design->factors.end() && std::find(f->levels.begin(), f->levels.end(), level) == f->levels.end())
          return BadInput(where, "'" + level + "' is not a level of factor '" + factor + "'" + DidYouMean(level, f->levels),
                          "use one of its levels, or leave the cell empty when unknown");
      }
      labels.Insert(write.seq(), key, factor, level);
      ++out.labels;
    }
  }
  out.items = static_cast<int64_t>(keys.size());
  RecordListingFile(store, write.seq(), ImportKind::kLabels, sha, path, static_cast<int64_t>(t.rows.size()));
  out.audit_hash = write.Commit("import labels " + path + ": " + std::to_string(out.labels) + " labels for " +
                                std::to_string(out.items) + " items");
  return out;
}

Result<LabelImport> LabelsFromProfiles(Store& store) {
  AuditedWrite write(store, "import labels --from-profiles");
  LabelImport out;
  ItemLabelWriter labels(store);
  std::set<std::string> keys;
  for (const ProfileLabelRow& row : ReadProfileLabels(store)) {
    labels.Insert(write.seq(), row.display_name, row.factor, row.level);
    keys.insert(row.display_name);
    ++out.labels;
  }
  if (out.labels == 0)
    return BadInput("", "the store holds no plan with profiles", "run 'twinprobe plan' first, or import a labels file");
  out.items = static_cast<int64_t>(keys.size());
  out.audit_hash = write.Commit("import labels --from-profiles: " + std::to_string(out.labels) + " labels for " +
                                std::to_string(out.items) + " profiles");
  return out;
}

}  // namespace twinprobe
