#include "core/read_study.h"

namespace twinprobe {

StudyReading ReadStudy(Store& store, const OutcomeScheme& scheme, const FieldworkOptions& options) {
  StudyReading r;
  FieldworkOptions with_sets = options;
  with_sets.completion_order = true;
  r.fieldwork = ReadFieldwork(store, scheme, with_sets);
  r.design = ReadStoredDesign(store);
  r.freeze = ReadFreeze(store);
  r.monitor_looks = ReadMonitorLooks(store);
  r.listings = ReadListings(store);
  if (!r.design.stages.empty()) r.code_counts = ReadCodeCounts(store);
  r.layout = ReadProbeLayout(store);
  r.declines = ReadDeclineFacts(store);
  r.covariates = ReadCovariates(store);
  return r;
}

}  // namespace twinprobe
