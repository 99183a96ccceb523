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
}

}  // namespace twinprobe
