#include "core/stored_codes.h"

#include <stdexcept>
#include <string>

namespace twinprobe {
namespace {

// One lookup for every table, so a code and its spelling are paired in one
// place only (the tables in the header).
template <typename E, size_t N>
std::optional<E> Parse(const std::pair<E, std::string_view> (&table)[N], std::string_view text) {
  for (const auto& [code, name] : table)
    if (name == text) return code;
  return std::nullopt;
}

template <typename E, size_t N>
std::string_view Name(const std::pair<E, std::string_view> (&table)[N], E code) {
  for (const auto& [c, name] : table)
    if (c == code) return name;
  // Only a value cast from an integer outside the enum gets here.
  throw std::logic_error("stored code " + std::to_string(static_cast<int>(code)) + " has no spelling");
}

}  // namespace

std::optional<DesignKind> ParseDesignKind(std::string_view text) { return Parse(kDesignKindNames, text); }
std::string_view DesignKindName(DesignKind kind) { return Name(kDesignKindNames, kind); }
std::optional<PlanOrigin> ParsePlanOrigin(std::string_view text) { return Parse(kPlanOriginNames, text); }
std::string_view PlanOriginName(PlanOrigin origin) { return Name(kPlanOriginNames, origin); }
std::optional<ImportKind> ParseImportKind(std::string_view text) { return Parse(kImportKindNames, text); }
std::string_view ImportKindName(ImportKind kind) { return Name(kImportKindNames, kind); }
std::optional<ExtractionState> ParseExtractionState(std::string_view text) {
  return Parse(kExtractionStateNames, text);
}
std::string_view ExtractionStateName(ExtractionState state) { return Name(kExtractionStateNames, state); }
std::optional<ReviewDecision> ParseReviewDecision(std::string_view text) { return Parse(kReviewDecisionNames, text); }
std::string_view ReviewDecisionName(ReviewDecision decision) { return Name(kReviewDecisionNames, decision); }
std::optional<CorrectionMethod> ParseCorrectionMethod(std::string_view text) {
  return Parse(kCorrectionMethodNames, text);
}
std::string_view CorrectionMethodName(CorrectionMethod method) { return Name(kCorrectionMethodNames, method); }
std::optional<FactorVary> ParseFactorVary(std::string_view text) { return Parse(kFactorVaryNames, text); }
std::string_view FactorVaryName(FactorVary vary) { return Name(kFactorVaryNames, vary); }
std::optional<MergePreference> ParseMergePreference(std::string_view text) {
  return Parse(kMergePreferenceNames, text);
}
std::string_view MergePreferenceName(MergePreference prefer) { return Name(kMergePreferenceNames, prefer); }

}  // namespace twinprobe
