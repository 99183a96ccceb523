#include "planner/freeze.h"

#include <utility>
#include <vector>

#include "core/audit.h"
#include "core/meta.h"
#include "core/sha256.h"

namespace twinprobe {

Result<FreezeRecord> FreezeStudy(Store& store, const Design& design) {
  AuditedWrite write(store, "freeze");
  if (auto earlier = ReadFreeze(store))
    return BadInput(store.path(),
                    "the study was frozen at " + earlier->at + " (design sha256 " + earlier->design_sha256 +
                        ") and a pre-registration cannot be replaced",
                    "keep the registration; reports list every later change as a deviation");
  FreezeRecord r;
  r.at = write.at();
  r.design_sha256 = Sha256Hex(design.canonical);
  r.analysis_plan = CanonicalAnalysisPlan(design);
  r.analysis_sha256 = Sha256Hex(r.analysis_plan);
  r.sent_before = store.QueryInt("SELECT count(*) FROM sending s JOIN current_probe p ON p.id = s.probe_id");
  r.responses_before = store.QueryInt("SELECT count(*) FROM response r JOIN current_probe p ON p.id = r.probe_id");
  Stmt ins = store.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES (?1, ?2, ?3)");
  for (const auto& [k, v] : std::vector<std::pair<const char*, std::string>>{
           {freeze_keys::kAt, r.at},
           {freeze_keys::kDesignSha256, r.design_sha256},
           {freeze_keys::kAnalysisSha256, r.analysis_sha256},
           {freeze_keys::kAnalysisPlan, r.analysis_plan},
           {freeze_keys::kSentBefore, std::to_string(r.sent_before)},
           {freeze_keys::kResponsesBefore, std::to_string(r.responses_before)}})
    ins.Bind(1, k).Bind(2, v).Bind(3, write.seq()).Run();
  r.audit_hash = write.Commit("freeze: design " + r.design_sha256.substr(0, 16) + ", analysis plan " +
                              r.analysis_sha256.substr(0, 16));
  return r;
}

}  // namespace twinprobe
