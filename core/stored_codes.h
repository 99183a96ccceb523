#pragma once
// Codes the store keeps as text, each an enum with one table of its stored
// spellings. A spelling is a file format: once written to a study.db it
// never changes and is never reused for another meaning (docs/schema.md,
// "Conventions"). Add a new code at the end of its table.
//
// Each code has Parse…(text) -> the enum, or nullopt for a spelling the
// table does not hold, and …Name(code) -> its stored spelling.
#include <optional>
#include <string_view>
#include <utility>

namespace twinprobe {

// plan.kind and [study] kind: how probes are grouped per vacancy.
enum class DesignKind { kPaired, kSets, kUnpaired, kListing };
inline constexpr std::pair<DesignKind, std::string_view> kDesignKindNames[] = {
    {DesignKind::kPaired, "paired"},
    {DesignKind::kSets, "sets"},
    {DesignKind::kUnpaired, "unpaired"},
    {DesignKind::kListing, "listing"},  // a listing audit: no probes
};

// plan.origin: made by `plan` from a design, or by an import of data.
enum class PlanOrigin { kPlanned, kImported };
inline constexpr std::pair<PlanOrigin, std::string_view> kPlanOriginNames[] = {
    {PlanOrigin::kPlanned, "plan"},
    {PlanOrigin::kImported, "import"},
};

// import_file.kind: which importer read the file (a second import of the
// same bytes by the same importer is a no-op).
enum class ImportKind { kOutcomes, kPairs, kLabels, kRanks };
inline constexpr std::pair<ImportKind, std::string_view> kImportKindNames[] = {
    {ImportKind::kOutcomes, "outcomes"},
    {ImportKind::kPairs, "pairs"},
    {ImportKind::kLabels, "labels"},
    {ImportKind::kRanks, "ranks"},
};

// listing.extraction: whether the fetched page gave its items.
enum class ExtractionState { kOk, kFailed };
inline constexpr std::pair<ExtractionState, std::string_view> kExtractionStateNames[] = {
    {ExtractionState::kOk, "ok"},
    {ExtractionState::kFailed, "failed"},
};

// review_decision.decision: what a person made of a logged mail message.
enum class ReviewDecision { kConfirmed, kChanged, kDismissed };
inline constexpr std::pair<ReviewDecision, std::string_view> kReviewDecisionNames[] = {
    {ReviewDecision::kConfirmed, "confirmed"},  // the suggested probe and code, as suggested
    {ReviewDecision::kChanged, "changed"},      // another probe or code than suggested
    {ReviewDecision::kDismissed, "dismissed"},  // no response recorded
};

// [analysis] correction, kept in the freeze: the multiple-comparison
// correction of the analysis plan.
enum class CorrectionMethod { kNone, kBonferroni, kHolm, kHochberg, kHommel, kBH, kBY };
inline constexpr std::pair<CorrectionMethod, std::string_view> kCorrectionMethodNames[] = {
    {CorrectionMethod::kNone, "none"},     {CorrectionMethod::kBonferroni, "bonferroni"},
    {CorrectionMethod::kHolm, "holm"},     {CorrectionMethod::kHochberg, "hochberg"},
    {CorrectionMethod::kHommel, "hommel"}, {CorrectionMethod::kBH, "bh"},
    {CorrectionMethod::kBY, "by"},
};

// factor_design.vary and [[factor]] vary: whether every vacancy receives
// every level of the factor, or one level each.
enum class FactorVary { kWithin, kBetween };
inline constexpr std::pair<FactorVary, std::string_view> kFactorVaryNames[] = {
    {FactorVary::kWithin, "within"},
    {FactorVary::kBetween, "between"},
};

// merge_choice.prefer: which store's current response a conflict kept.
enum class MergePreference { kMain, kOffice };
inline constexpr std::pair<MergePreference, std::string_view> kMergePreferenceNames[] = {
    {MergePreference::kMain, "main"},      // the main store's, restated after the office's
    {MergePreference::kOffice, "office"},  // the merged office's
};

std::optional<DesignKind> ParseDesignKind(std::string_view text);
std::string_view DesignKindName(DesignKind kind);
std::optional<PlanOrigin> ParsePlanOrigin(std::string_view text);
std::string_view PlanOriginName(PlanOrigin origin);
std::optional<ImportKind> ParseImportKind(std::string_view text);
std::string_view ImportKindName(ImportKind kind);
std::optional<ExtractionState> ParseExtractionState(std::string_view text);
std::string_view ExtractionStateName(ExtractionState state);
std::optional<ReviewDecision> ParseReviewDecision(std::string_view text);
std::string_view ReviewDecisionName(ReviewDecision decision);
std::optional<CorrectionMethod> ParseCorrectionMethod(std::string_view text);
std::string_view CorrectionMethodName(CorrectionMethod method);
std::optional<FactorVary> ParseFactorVary(std::string_view text);
std::string_view FactorVaryName(FactorVary vary);
std::optional<MergePreference> ParseMergePreference(std::string_view text);
std::string_view MergePreferenceName(MergePreference prefer);

}  // namespace twinprobe
