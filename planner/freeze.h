#pragma once
// Pre-registration (`freeze`): the SHA-256 of the canonical design
// (Design::canonical: study.toml as parsed, comments and layout aside) and of
// the canonical analysis plan (CanonicalAnalysisPlan in core/design.h) are
// stored in the study's meta table, with the plan's text itself so later
// deviations can be named item by item (analysis/deviations.h).
//
// Meta keys: freeze.at, freeze.design_sha256, freeze.analysis_sha256,
// freeze.analysis_plan, freeze.sent_before, freeze.responses_before.
#include <cstdint>
#include <optional>
#include <string>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct FreezeRecord {
  std::string at;  // ISO time of the freeze
  std::string design_sha256;
  std::string analysis_sha256;
  std::string analysis_plan;  // the canonical analysis plan text
  int64_t sent_before = 0;       // probes of the current plan already sent
  int64_t responses_before = 0;  // responses already recorded
  std::string audit_hash;        // head of the audit chain after the freeze
};

// Stores the freeze in one audited write. Refuses (bad input, store
// unchanged) when the study was frozen before: a registration stands as made,
// later changes are deviations.
Result<FreezeRecord> FreezeStudy(Store& store, const Design& design);

// The stored freeze, if any (audit_hash left empty).
std::optional<FreezeRecord> ReadFreeze(Store& store);

}  // namespace twinprobe
