#include "core/read_freeze.h"

#include "core/meta.h"

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

}  // namespace twinprobe
