#include "core/read_freeze.h"

#include <string>
#include <utility>
#include <vector>

#include "core/meta.h"
#include "core/store.h"

namespace twinprobe {

std::optional<FreezeRecord> ReadFreeze(Store& store) {
  auto at = MetaValue(store, freeze_keys::kAt);
  if (!at) return std::nullopt;
  FreezeRecord r;
  r.at = *at;
  r.design_sha256 = MetaValue(store, freeze_keys::kDesignSha256).value_or("");
  r.analysis_sha256 = MetaValue(store, freeze_keys::kAnalysisSha256).value_or("");
  r.analysis_plan = MetaValue(store, freeze_keys::kAnalysisPlan).value_or("");
  r.sent_before = std::stoll(MetaValue(store, freeze_keys::kSentBefore).value_or("0"));
  r.responses_before = std::stoll(MetaValue(store, freeze_keys::kResponsesBefore).value_or("0"));
  r.inputs = MetaValue(store, freeze_keys::kInputs).value_or("");
  return r;
}

void WriteFreeze(Store& store, const FreezeRecord& r, int64_t seq) {
  Stmt ins = store.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES (?1, ?2, ?3)");
  for (const auto& [k, v] : std::vector<std::pair<const char*, std::string>>{
           {freeze_keys::kAt, r.at},
           {freeze_keys::kDesignSha256, r.design_sha256},
           {freeze_keys::kAnalysisSha256, r.analysis_sha256},
           {freeze_keys::kAnalysisPlan, r.analysis_plan},
           {freeze_keys::kSentBefore, std::to_string(r.sent_before)},
           {freeze_keys::kResponsesBefore, std::to_string(r.responses_before)}})
    ins.Bind(1, k).Bind(2, v).Bind(3, seq).Run();
  if (!r.inputs.empty()) ins.Bind(1, freeze_keys::kInputs).Bind(2, r.inputs).Bind(3, seq).Run();
}

namespace {
std::string Flat(std::string s) {
  for (char& ch : s)
    if (ch == '\t' || ch == '\n' || ch == '\r') ch = ' ';
  return s;
}
}  // namespace

std::string FormatInputs(const std::vector<FrozenInput>& inputs) {
  std::string out;
  for (const FrozenInput& f : inputs) {
    out += "file\t" + Flat(f.role) + "\t" + Flat(f.file) + "\t" + f.sha256 + "\n";
    for (const auto& [key, digest] : f.records) out += "\t" + Flat(key) + "\t" + digest + "\n";
  }
  return out;
}

std::vector<FrozenInput> ParseInputs(const std::string& text) {
  std::vector<FrozenInput> out;
  size_t pos = 0;
  while (pos < text.size()) {
    size_t end = text.find('\n', pos);
    if (end == std::string::npos) end = text.size();
    const std::string line = text.substr(pos, end - pos);
    pos = end + 1;
    std::vector<std::string> parts;
    size_t start = 0;
    for (;;) {
      size_t tab = line.find('\t', start);
      parts.push_back(line.substr(start, tab - start));
      if (tab == std::string::npos) break;
      start = tab + 1;
    }
    if (parts.size() == 4 && parts[0] == "file") out.push_back({parts[1], parts[2], parts[3], {}});
    else if (parts.size() == 3 && parts[0].empty() && !out.empty()) out.back().records.emplace_back(parts[1], parts[2]);
  }
  return out;
}

}  // namespace twinprobe
