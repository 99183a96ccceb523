#include "planner/freeze.h"

#include "core/audit.h"
#include "core/meta.h"
#include "core/sha256.h"

namespace twinprobe {

std::optional<FreezeRecord> ReadFreeze(Store& store) {
  auto at = MetaValue(store, "freeze.at");
  if (!at) return std::nullopt;
  FreezeRecord r;
  r.at = *at;
  r.design_sha256 = MetaValue(store, "freeze.design_sha256").value_or("");
  r.analysis_sha256 = MetaValue(store, "freeze.analysis_sha256").value_or("");
  r.analysis_plan = MetaValue(store, "freeze.analysis_plan").value_or("");
  r.sent_before = std::stoll(MetaValue(store, "freeze.sent_before").value_or("0"));
  r.responses_before = std::stoll(MetaValue(store, "freeze.responses_before").value_or("0"));
  return r;
}

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
  for (const auto& [k, v] : std::vector<std::pair<std::string, std::string>>{
           {"freeze.at", r.at},
           {"freeze.design_sha256", r.design_sha256},
           {"freeze.analysis_sha256", r.analysis_sha256},
           {"freeze.analysis_plan", r.analysis_plan},
           {"freeze.sent_before", std::to_string(r.sent_before)},
           {"freeze.responses_before", std::to_string(r.responses_before)}})
    ins.Bind(1, k).Bind(2, v).Bind(3, write.seq()).Run();
  r.audit_hash = write.Commit("freeze: design " + r.design_sha256.substr(0, 16) + ", analysis plan " +
                              r.analysis_sha256.substr(0, 16));
  return r;
}

}  // namespace twinprobe
