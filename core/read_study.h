#pragma once
// Everything `analyze`, `report` and `monitor` read from the store, as plain
// values: the fieldwork (core/fieldwork.h), the stored design
// (core/read_design.h), the freeze (core/read_freeze.h) and the ranked lists
// (core/read_listings.h). analysis/ computes on this value and never sees the
// store.
#include <optional>

#include "core/decline_records.h"
#include "core/covariate_records.h"
#include "core/design.h"
#include "core/fieldwork.h"
#include "core/probe_layout.h"
#include "core/read_design.h"
#include "core/read_freeze.h"
#include "core/read_listings.h"
#include "core/monitor_looks.h"
#include "core/stage_counts.h"

namespace twinprobe {

class Store;

struct StudyReading {
  Fieldwork fieldwork;
  StoredDesign design;
  std::optional<FreezeRecord> freeze;
  ListingData listings;
  std::vector<StoredLook> monitor_looks;  // interim looks taken (core/monitor_looks.h)
  std::vector<StageCodeCount> code_counts;  // filled when the plan has hiring stages (design.stages)
  // Template and send position of every probe (the adjusted model); the
  // fieldwork's `completed` sets carry the outcomes it is joined with.
  ProbeLayouts layout;
  DeclineReading declines;  // current responses with their declines (core/decline_records.h)
  CovariateTable covariates;  // imported with --covariates (core/covariate_records.h); empty names otherwise
};

// `scheme` decides which response codes are positive (the design's scheme
// when there is a design file, else the stored one). The fieldwork is read
// with its completion order (Fieldwork::completed), whatever `options` say:
// the adjusted model joins it with `layout`.
StudyReading ReadStudy(Store& store, const OutcomeScheme& scheme, const FieldworkOptions& options = {});

}  // namespace twinprobe
