// analysis/effects.h on study shapes built directly (paired, sets with three
// arms, unpaired), checked against the stats/ functions on hand-counted tables.
#include <catch2/catch.hpp>

#include "analysis/effects.h"
#include "stats/paired_midp.h"
#include "stats/paired_ratio.h"

using namespace twinprobe;

namespace {

// Adds `count` sets with the given outcomes per arm and one stratum value.
void AddSets(EffectsInput& in, int count, std::vector<std::pair<int, bool>> probes, const std::string& region) {
  for (int i = 0; i < count; ++i) in.sets.push_back({probes, {{"region", region}}});
}

}  // namespace

TEST_CASE("effects: a paired study gives every McNemar quantity and corrected strata") {
  EffectsInput in;
  in.kind = "paired";
  in.arm_labels = {"ref", "other"};
  in.correction = "holm";
  // North: a=3 b=9 c=2 d=6; South: a=1 b=4 c=4 d=5.
  AddSets(in, 3, {{0, true}, {1, true}}, "North");
  AddSets(in, 9, {{0, true}, {1, false}}, "North");
  AddSets(in, 2, {{0, false}, {1, true}}, "North");
  AddSets(in, 6, {{0, false}, {1, false}}, "North");
  AddSets(in, 1, {{0, true}, {1, true}}, "South");
  AddSets(in, 4, {{0, true}, {1, false}}, "South");
  AddSets(in, 4, {{0, false}, {1, true}}, "South");
  AddSets(in, 5, {{1, false}, {0, false}}, "South");
  Effects e = ComputeEffects(in);
  REQUIRE(e.comparisons.size() == 1);
  const ArmComparison& c = e.comparisons[0];
  CHECK(c.pairs.a == 4);
  CHECK(c.pairs.b == 13);
  CHECK(c.pairs.c == 6);
  CHECK(c.pairs.d == 11);
  CHECK(c.p.p == stats::McNemar({4, 13, 6, 11}).exact.p);
  CHECK(c.conditional_or.estimate == 13.0 / 6.0);
  CHECK(c.net.among_positive.estimate == Approx(7.0 / 23.0));
  REQUIRE(e.strata.size() == 2);
  auto adjusted = stats::AdjustP({stats::McNemar({3, 9, 2, 6}).exact.p, stats::McNemar({1, 4, 4, 5}).exact.p},
                                 stats::Adjustment::kHolm);
  CHECK(e.strata[0].value == "North");
  CHECK(e.strata[0].result.p_adjusted == adjusted[0]);
  CHECK(e.strata[1].result.p_adjusted == adjusted[1]);
  REQUIRE(e.across.size() == 1);
  // Across regions the pairs are kept: the discordant split (b, c) per region
  // (North 9, 2; South 4, 4), no Mantel-Haenszel on arm x outcome tables.
  const AcrossStrata& across = e.across[0];
  CHECK(across.paired);
  REQUIRE(across.discordant.size() == 2);
  CHECK(across.discordant[0].b == 9);
  CHECK(across.discordant[1].c == 4);
  CHECK(across.tables.empty());
  CHECK(across.mh.strata_used == 0);
  // R 4.2.2: x <- chisq.test(cbind(c(9, 4), c(2, 4)), correct = FALSE):
  // X-squared = 2.170163170163171, p-value = 0.140711303107482;
  // fisher.test(cbind(c(9, 4), c(2, 4)))$p.value = 0.318885448916409.
  CHECK_THAT(across.homogeneity.chi2, Catch::Matchers::WithinRel(2.170163170163171, 1e-9));
  CHECK_THAT(across.homogeneity.chi2_p.p, Catch::Matchers::WithinRel(0.140711303107482, 1e-9));
  REQUIRE(across.homogeneity.exact_p.has_value());
  CHECK_THAT(*across.homogeneity.exact_p, Catch::Matchers::WithinRel(0.318885448916409, 1e-9));
  CHECK(across.homogeneity.small_expected);  // R warns "Chi-squared approximation may be incorrect"
  CHECK(across.homogeneity.pooled_odds_ratio.estimate == 13.0 / 6.0);
}

TEST_CASE("effects: a paired comparison carries the callback-rate ratio and the mid-p interval of b/c") {
  EffectsInput in;
  in.arm_labels = {"ref", "other"};
  AddSets(in, 4, {{0, true}, {1, true}}, "North");
  AddSets(in, 13, {{0, true}, {1, false}}, "North");
  AddSets(in, 6, {{0, false}, {1, true}}, "North");
  AddSets(in, 11, {{0, false}, {1, false}}, "North");
  const ArmComparison& c = ComputeEffects(in).comparisons.at(0);
  // (a+b)/(a+c) = 17/10; the intervals are those of stats/paired_ratio.h
  // and stats/paired_midp.h, checked against their papers in tests/stats/.
  CHECK(c.callback_ratio.estimate == 17.0 / 10.0);
  CHECK(c.callback_ratio.ci.low == stats::CallbackRatio({4, 13, 6, 11}, 0.95).ci.low);
  CHECK(c.callback_ratio.ci.high == stats::CallbackRatio({4, 13, 6, 11}, 0.95).ci.high);
  CHECK(c.conditional_or_mid_p.estimate == 13.0 / 6.0);
  CHECK(c.conditional_or_mid_p.ci.low == stats::ConditionalOddsRatioMidP({13, 6}, 0.95).ci.low);
  CHECK(c.conditional_or_mid_p.ci.low > c.conditional_or.ci.low);  // mid-p is narrower than the exact interval
  CHECK(c.conditional_or_mid_p.ci.high < c.conditional_or.ci.high);
}

TEST_CASE("effects: a margin in the design adds the equivalence test to the comparison of all pairs") {
  EffectsInput in;
  in.arm_labels = {"ref", "other"};
  AddSets(in, 4, {{0, true}, {1, true}}, "North");
  AddSets(in, 13, {{0, true}, {1, false}}, "North");
  AddSets(in, 6, {{0, false}, {1, true}}, "South");
  AddSets(in, 11, {{0, false}, {1, false}}, "South");
  CHECK_FALSE(ComputeEffects(in).comparisons.at(0).equivalence.has_value());  // no margin, no test
  in.equivalence_margin = 0.1;
  in.alpha = 0.05;
  const Effects e = ComputeEffects(in);
  REQUIRE(e.comparisons.at(0).equivalence.has_value());
  const auto& q = *e.comparisons[0].equivalence;
  const auto expected = stats::PairedEquivalence({4, 13, 6, 11}, -0.1, 0.1, 0.05);
  CHECK(q.p.p == expected.p.p);
  CHECK(q.estimate == Approx(7.0 / 34.0));
  CHECK_FALSE(q.equivalent);  // the difference 0.21 lies outside +/-0.1
  for (const auto& s : e.strata) CHECK_FALSE(s.result.equivalence.has_value());  // the plan states it for all pairs
}

TEST_CASE("effects: sets with three arms compare each arm with the reference and correct across arms") {
  EffectsInput in;
  in.kind = "sets";
  in.arm_labels = {"ref", "x", "y"};
  in.correction = "bonferroni";
  AddSets(in, 10, {{0, true}, {1, false}, {2, true}}, "A");
  AddSets(in, 2, {{0, false}, {1, true}, {2, false}}, "A");
  AddSets(in, 20, {{0, false}, {1, false}, {2, false}}, "A");
  Effects e = ComputeEffects(in);
  REQUIRE(e.comparisons.size() == 2);
  CHECK(e.comparisons[0].pairs.b == 10);
  CHECK(e.comparisons[0].pairs.c == 2);
  CHECK(e.comparisons[1].pairs.a == 10);
  CHECK(e.comparisons[1].pairs.b == 0);
  CHECK(e.comparisons[1].pairs.c == 0);
  CHECK(e.comparisons[0].p_adjusted == std::min(1.0, 2 * stats::McNemar({0, 10, 2, 20}).exact.p));
  CHECK(e.comparisons[1].p_adjusted == 1.0);
  // One region value only: nothing to stratify by (issue 16), so no
  // per-value rows and no test across values, but the column is named.
  CHECK(e.across.empty());
  CHECK(e.strata.empty());
  REQUIRE(e.single_strata.size() == 1);
  CHECK(e.single_strata[0].column == "region");
  CHECK(e.single_strata[0].value == "A");
  AddSets(in, 1, {{0, true}, {1, false}, {2, false}}, "B");
  Effects two = ComputeEffects(in);
  CHECK(two.across.size() == 2);  // one column x two comparisons
  CHECK(two.strata.size() == 4);  // two values x two comparisons
  CHECK(two.single_strata.empty());
}

TEST_CASE("effects: an unpaired study uses Fisher, Woolf and Wilson per arm against the reference") {
  EffectsInput in;
  in.kind = "unpaired";
  in.arm_labels = {"ref", "x"};
  in.correction = "none";
  AddSets(in, 3, {{0, true}}, "A");
  AddSets(in, 1, {{0, false}}, "A");
  AddSets(in, 1, {{1, true}}, "A");
  AddSets(in, 3, {{1, false}}, "A");
  Effects e = ComputeEffects(in);
  REQUIRE(e.comparisons.size() == 1);
  const ArmComparison& c = e.comparisons[0];
  CHECK_FALSE(c.paired);
  CHECK(c.table.a == 3);
  CHECK(c.table.d == 3);
  CHECK(c.p.p == Approx(34.0 / 70.0).epsilon(1e-12));  // tea-tasting table, two-sided
  CHECK(c.woolf.estimate == 9.0);
  CHECK(c.reference_wilson.low == stats::Wilson(3, 4, 0.95).low);
  CHECK(e.correction == "none");
  // One region value: no stratified analysis (issue 16), the column named instead.
  CHECK(e.strata.empty());
  CHECK(e.across.empty());
  REQUIRE(e.single_strata.size() == 1);
  CHECK(e.single_strata[0].value == "A");
  // A second region: Mantel-Haenszel across the two (unpaired probes are
  // independent, so it stays across strata).
  AddSets(in, 2, {{0, true}}, "B");
  AddSets(in, 1, {{0, false}}, "B");
  AddSets(in, 1, {{1, true}}, "B");
  AddSets(in, 2, {{1, false}}, "B");
  Effects two = ComputeEffects(in);
  CHECK(two.single_strata.empty());
  REQUIRE(two.strata.size() == 2);
  CHECK(two.strata[0].result.p_adjusted == two.strata[0].result.p.p);
  REQUIRE(two.across.size() == 1);
  CHECK_FALSE(two.across[0].paired);
  REQUIRE(two.across[0].tables.size() == 2);
  CHECK(two.across[0].tables[0].a == 3);
  CHECK(two.across[0].mh.estimate == stats::MantelHaenszel({{3, 1, 1, 3}, {2, 1, 1, 2}}, 0.95).estimate);
}
