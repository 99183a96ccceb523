#include "planner/freeze.h"

#include "core/audit.h"
#include "core/meta.h"
#include "core/plan_rows.h"
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
  r.inputs = design.inputs;  // every input file of the analysis, record by record
  const CurrentPlanFieldwork done = ReadCurrentPlanFieldwork(store);
  r.sent_before = done.sendings;
  r.responses_before = done.responses;
  WriteFreeze(store, r, write.seq());
  r.audit_hash = write.Commit("freeze: design " + r.design_sha256.substr(0, 16) + ", analysis plan " +
                              r.analysis_sha256.substr(0, 16));
  return r;
}

}  // namespace twinprobe
