#include "core/read_study.h"

namespace twinprobe {

StudyReading ReadStudy(Store& store, const OutcomeScheme& scheme, const FieldworkOptions& options) {
  StudyReading r;
  r.fieldwork = ReadFieldwork(store, scheme, options);
  r.design = ReadStoredDesign(store);
  r.freeze = ReadFreeze(store);
  r.monitor_looks = ReadMonitorLooks(store);
  r.listings = ReadListings(store);
  if (!r.design.stages.empty()) r.code_counts = ReadCodeCounts(store);
  return r;
}

}  // namespace twinprobe
