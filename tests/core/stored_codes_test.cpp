// Stored codes are a file format: these tests pin every spelling, so that a
// rename fails here before it can make an existing study.db unreadable.
#include <catch2/catch.hpp>

#include <set>
#include <string>

#include "core/stored_codes.h"
#include "stats/adjust.h"

using namespace twinprobe;

namespace {

// Every code parses back from its spelling, and no spelling is used twice.
template <typename E, size_t N, typename ParseFn, typename NameFn>
void CheckRoundTrip(const std::pair<E, std::string_view> (&table)[N], ParseFn parse, NameFn name) {
  std::set<std::string_view> spellings;
  for (const auto& [code, spelling] : table) {
    CHECK(parse(spelling) == code);
    CHECK(name(code) == spelling);
    CHECK(spellings.insert(spelling).second);
  }
}

}  // namespace

TEST_CASE("stored codes: every spelling parses back to its code and none is used twice") {
  CheckRoundTrip(kDesignKindNames, ParseDesignKind, DesignKindName);
  CheckRoundTrip(kPlanOriginNames, ParsePlanOrigin, PlanOriginName);
  CheckRoundTrip(kImportKindNames, ParseImportKind, ImportKindName);
  CheckRoundTrip(kExtractionStateNames, ParseExtractionState, ExtractionStateName);
  CheckRoundTrip(kReviewDecisionNames, ParseReviewDecision, ReviewDecisionName);
  CheckRoundTrip(kCorrectionMethodNames, ParseCorrectionMethod, CorrectionMethodName);
  CheckRoundTrip(kFactorVaryNames, ParseFactorVary, FactorVaryName);
}

TEST_CASE("stored codes: the spellings are the ones earlier versions wrote") {
  CHECK(DesignKindName(DesignKind::kPaired) == "paired");
  CHECK(DesignKindName(DesignKind::kSets) == "sets");
  CHECK(DesignKindName(DesignKind::kUnpaired) == "unpaired");
  CHECK(DesignKindName(DesignKind::kListing) == "listing");
  CHECK(PlanOriginName(PlanOrigin::kPlanned) == "plan");
  CHECK(PlanOriginName(PlanOrigin::kImported) == "import");
  CHECK(ImportKindName(ImportKind::kOutcomes) == "outcomes");
  CHECK(ImportKindName(ImportKind::kPairs) == "pairs");
  CHECK(ImportKindName(ImportKind::kLabels) == "labels");
  CHECK(ImportKindName(ImportKind::kRanks) == "ranks");
  CHECK(ExtractionStateName(ExtractionState::kOk) == "ok");
  CHECK(ExtractionStateName(ExtractionState::kFailed) == "failed");
  CHECK(ReviewDecisionName(ReviewDecision::kConfirmed) == "confirmed");
  CHECK(ReviewDecisionName(ReviewDecision::kChanged) == "changed");
  CHECK(ReviewDecisionName(ReviewDecision::kDismissed) == "dismissed");
  CHECK(CorrectionMethodName(CorrectionMethod::kNone) == "none");
  CHECK(CorrectionMethodName(CorrectionMethod::kBonferroni) == "bonferroni");
  CHECK(CorrectionMethodName(CorrectionMethod::kHolm) == "holm");
  CHECK(CorrectionMethodName(CorrectionMethod::kHochberg) == "hochberg");
  CHECK(CorrectionMethodName(CorrectionMethod::kHommel) == "hommel");
  CHECK(CorrectionMethodName(CorrectionMethod::kBH) == "bh");
  CHECK(CorrectionMethodName(CorrectionMethod::kBY) == "by");
  CHECK(FactorVaryName(FactorVary::kWithin) == "within");
  CHECK(FactorVaryName(FactorVary::kBetween) == "between");
}

TEST_CASE("stored codes: a spelling outside the table parses to nothing (case and blanks count)") {
  CHECK_FALSE(ParseDesignKind("Paired").has_value());
  CHECK_FALSE(ParsePlanOrigin("plan ").has_value());
  CHECK_FALSE(ParseImportKind("").has_value());
  CHECK_FALSE(ParseExtractionState("partial").has_value());
  CHECK_FALSE(ParseReviewDecision("confirm").has_value());
  CHECK_FALSE(ParseCorrectionMethod("BH").has_value());
}

TEST_CASE("stored codes: every correction spelling is a method the adjustment code applies") {
  // The freeze stores the correction by this spelling and analysis hands it
  // to stats::ParseAdjustment, so both must name the same methods.
  for (const auto& [method, spelling] : kCorrectionMethodNames) {
    auto adjustment = stats::ParseAdjustment(std::string(spelling));
    REQUIRE(adjustment.has_value());
    CHECK(stats::AdjustmentName(*adjustment) == spelling);
  }
}
