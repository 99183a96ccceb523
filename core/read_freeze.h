#pragma once
// The pre-registration as the store keeps it: `freeze` (planner/freeze.h)
// writes these meta keys once, analysis compares them with the design in use
// (analysis/deviations.h). The key names are stored spellings: they never
// change once written.
#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace twinprobe {

class Store;

namespace freeze_keys {
inline constexpr const char* kAt = "freeze.at";
inline constexpr const char* kDesignSha256 = "freeze.design_sha256";
inline constexpr const char* kAnalysisSha256 = "freeze.analysis_sha256";
inline constexpr const char* kAnalysisPlan = "freeze.analysis_plan";
inline constexpr const char* kSentBefore = "freeze.sent_before";
inline constexpr const char* kResponsesBefore = "freeze.responses_before";
// Every input file of the analysis as frozen (FormatInputs below); absent in
// freezes made before inputs were covered.
inline constexpr const char* kInputs = "freeze.inputs";
}  // namespace freeze_keys

// One input file of the analysis (the design file, the vacancy file, a name
// pool, a template) as freeze saw it: its SHA-256 and a short digest of each
// record under a key (a design key such as "[analysis].alpha", a vacancy's
// id, "line 7"), so a later change can be named by file and key.
struct FrozenInput {
  std::string role;    // design | vacancies | name_pool | template
  std::string file;    // as the design names it
  std::string sha256;  // of the whole file; "" when it could not be read
  std::vector<std::pair<std::string, std::string>> records;  // key -> first 16 hex of the record's SHA-256
};

// The stored text of the inputs: per file a line "file<TAB>role<TAB>path<TAB>sha256",
// then one line "<TAB>key<TAB>digest" per record. Keys and paths hold no tab or
// line break (the writer replaces them by spaces).
std::string FormatInputs(const std::vector<FrozenInput>& inputs);
std::vector<FrozenInput> ParseInputs(const std::string& text);

struct FreezeRecord {
  std::string at;  // ISO time of the freeze
  std::string design_sha256;
  std::string analysis_sha256;
  std::string analysis_plan;     // the canonical analysis plan text
  int64_t sent_before = 0;       // probes of the current plan already sent
  int64_t responses_before = 0;  // responses already recorded
  std::string inputs;            // FormatInputs text; "" in freezes made before inputs were covered
  std::string audit_hash;        // head of the audit chain after the freeze (set by FreezeStudy only)
};

// Writes the freeze keys of `r` (all but audit_hash) as meta rows sealed
// under audit entry `seq`. Requires: inside that entry's AuditedWrite, and no
// freeze stored yet (the caller checks with ReadFreeze).
void WriteFreeze(Store& store, const FreezeRecord& r, int64_t seq);

// The stored freeze, if any (audit_hash left empty).
std::optional<FreezeRecord> ReadFreeze(Store& store);

}  // namespace twinprobe
