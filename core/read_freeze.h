#pragma once
// The pre-registration as the store keeps it: `freeze` (planner/freeze.h)
// writes these meta keys once, analysis compares them with the design in use
// (analysis/deviations.h). The key names are stored spellings: they never
// change once written.
#include <cstdint>
#include <optional>
#include <string>

namespace twinprobe {

class Store;

namespace freeze_keys {
inline constexpr const char* kAt = "freeze.at";
inline constexpr const char* kDesignSha256 = "freeze.design_sha256";
inline constexpr const char* kAnalysisSha256 = "freeze.analysis_sha256";
inline constexpr const char* kAnalysisPlan = "freeze.analysis_plan";
inline constexpr const char* kSentBefore = "freeze.sent_before";
inline constexpr const char* kResponsesBefore = "freeze.responses_before";
}  // namespace freeze_keys

struct FreezeRecord {
  std::string at;  // ISO time of the freeze
  std::string design_sha256;
  std::string analysis_sha256;
  std::string analysis_plan;     // the canonical analysis plan text
  int64_t sent_before = 0;       // probes of the current plan already sent
  int64_t responses_before = 0;  // responses already recorded
  std::string audit_hash;        // head of the audit chain after the freeze (set by FreezeStudy only)
};

// Writes the freeze keys of `r` (all but audit_hash) as meta rows sealed
// under audit entry `seq`. Requires: inside that entry's AuditedWrite, and no
// freeze stored yet (the caller checks with ReadFreeze).
void WriteFreeze(Store& store, const FreezeRecord& r, int64_t seq);

// The stored freeze, if any (audit_hash left empty).
std::optional<FreezeRecord> ReadFreeze(Store& store);

}  // namespace twinprobe
