#include "core/meta.h"

#include "core/store.h"

namespace twinprobe {

std::optional<std::string> MetaValue(Store& store, const std::string& key) {
  Stmt s = store.Prepare("SELECT value FROM meta WHERE key = ?1 ORDER BY id DESC LIMIT 1");
  s.Bind(1, key);
  if (!s.Step()) return std::nullopt;
  return s.Text(0);
}

void StoreMetaValue(Store& store, int64_t seq, const std::string& key, const std::string& value) {
  Stmt s = store.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES (?1, ?2, ?3)");
  s.Bind(1, key).Bind(2, value).Bind(3, seq).Run();
}

std::vector<std::string> MetaList(Store& store, const std::string& key) {
  std::vector<std::string> out;
  auto v = MetaValue(store, key);
  if (!v || v->empty()) return out;
  size_t start = 0;
  for (;;) {
    size_t comma = v->find(',', start);
    out.push_back(v->substr(start, comma - start));
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  return out;
}

OutcomeScheme StoredOutcomeScheme(Store& store) {
  OutcomeScheme s;
  auto codes = MetaList(store, "outcomes.codes");
  auto positive = MetaList(store, "outcomes.positive");
  if (!codes.empty()) s.codes = codes;
  if (!positive.empty()) s.positive = positive;
  if (auto w = MetaValue(store, "outcomes.window_days")) s.window_days = std::stoi(*w);
  return s;
}

}  // namespace twinprobe
