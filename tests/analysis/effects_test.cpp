// analysis/effects.h on study shapes built directly (paired, sets with three
// arms, unpaired), checked against the stats/ functions on hand-counted tables.
#include <catch2/catch.hpp>

#include "analysis/effects.h"

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
  // Arm x outcome per region: North ref 12+/8-, other 5+/15-; South ref 5+/9-, other 5+/9-.
  auto mh = stats::MantelHaenszel({{12, 8, 5, 15}, {5, 9, 5, 9}}, 0.95);
  CHECK(e.across[0].mh.estimate == mh.estimate);
  CHECK(e.across[0].breslow_day.df == 1);
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
  CHECK(e.across.size() == 2);  // one column x two comparisons
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
  CHECK(e.strata[0].result.p_adjusted == e.strata[0].result.p.p);
}
