// Issue 18: after an early stop, the stage-wise ordering p-value and the
// repeated confidence interval beside the naive ones (analysis/early_stop.h).
#include <catch2/catch.hpp>

#include "analysis/early_stop.h"
#include "stats/sequential.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// Stored looks as monitor would write them: boundaries from
// stats::ExactSequentialBoundaries for the given (information, b, c).
std::vector<StoredLook> Looks(const std::vector<std::tuple<double, int64_t, int64_t>>& looks, int stop) {
  std::vector<stats::SequentialLook> seq;
  for (const auto& [t, b, c] : looks) seq.push_back({t, b + c});
  auto bounds = stats::ExactSequentialBoundaries(seq, 0.05, stats::Spending::kOBrienFleming);
  std::vector<StoredLook> out;
  for (size_t k = 0; k < looks.size(); ++k) {
    StoredLook l;
    l.look = static_cast<int64_t>(k + 1);
    l.kind = "planned";
    l.sets = 100 * l.look;
    l.planned_sets = 400;
    l.information = std::get<0>(looks[k]);
    l.reference_only = std::get<1>(looks[k]);
    l.other_only = std::get<2>(looks[k]);
    l.discordant = l.reference_only + l.other_only;
    l.lower = bounds[k].lower;
    l.alpha = 0.05;
    l.spending = "obf";
    l.alpha_allowed = bounds[k].alpha_allowed;
    l.alpha_spent = bounds[k].alpha_spent;
    l.decision = static_cast<int>(k) == stop ? "stop" : "continue";
    l.taken_at = "2027-03-0" + std::to_string(k + 1) + "T12:00:00Z";
    out.push_back(l);
  }
  return out;
}

}  // namespace

TEST_CASE("early stop: at the first look the stage-wise p is the naive p and the repeated interval is wider") {
  // Look 1 at information 0.5, 20 of 24 discordant sets favour the reference
  // arm. Jennison & Turnbull (2000, §8.4): at the first analysis the
  // stage-wise ordering p-value is the fixed-sample one. R 4.2:
  // binom.test(20, 24)$p.value = 0.00154387950897217. The repeated interval
  // uses the look's nominal level 1 - 2(1 - pnorm(2.9625880427)) =
  // 0.996949354483749 (the boundary of rpact 3.3.4, two-sided O'Brien–Fleming
  // type, looks at 0.5 and 1; tests/reference/power/spending_boundaries.csv):
  // binom.test(20, 24, conf.level = 0.996949354483749)$conf.int mapped
  // through p / (1 - p) gives 1.08935342210847 to 46.1941915765895; the naive
  // 95% interval, binom.test(20, 24)$conf.int mapped alike, 1.67492889080788
  // to 20.1177067449095.
  const EarlyStop e = ComputeEarlyStop(Looks({{0.5, 20, 4}}, 0));
  REQUIRE(e.present);
  CHECK(e.look == 1);
  CHECK_THAT(e.naive_p, WithinRel(0.00154387950897217, 1e-9));
  CHECK_THAT(e.stagewise_p, WithinRel(0.00154387950897217, 1e-9));
  CHECK_THAT(e.naive_lower, WithinRel(1.67492889080788, 1e-6));
  CHECK_THAT(e.naive_upper, WithinRel(20.1177067449095, 1e-6));
  CHECK_THAT(e.repeated_conf, WithinRel(0.996949354483749, 1e-6));
  CHECK_THAT(e.repeated_lower, WithinRel(1.08935342210847, 1e-4));
  CHECK_THAT(e.repeated_upper, WithinRel(46.1941915765895, 1e-4));
}

TEST_CASE("early stop: a stop at the second look adds the chance of stopping at the first") {
  // Hand computation of the stage-wise ordering p-value (Jennison & Turnbull
  // 2000, §8.4; exact fractions in Python 3.11): look 1 has 10 discordant
  // sets and stops only at b = 0 or 10 (2/1024 of the walk; the O'Brien–
  // Fleming-type allowance at t = 0.5 is 0.00305). Look 2 at t = 0.75 has 30
  // and stops at b = 24. p = 2/1024 + P(0 < b1 < 10, b2 <= 6 or b2 >= 24)
  // = 219541/67108864 = 0.00327141582965851, more than the naive
  // binom.test(24, 30)$p.value = 0.00143090635538101 (R 4.2).
  const EarlyStop e = ComputeEarlyStop(Looks({{0.5, 6, 4}, {0.75, 24, 6}}, 1));
  REQUIRE(e.present);
  CHECK(e.look == 2);
  CHECK(e.b == 24);
  CHECK_THAT(e.stagewise_p, WithinRel(219541.0 / 67108864.0, 1e-12));
  CHECK_THAT(e.naive_p, WithinRel(0.00143090635538101, 1e-9));
  CHECK(e.stagewise_p > e.naive_p);
  CHECK(e.repeated_lower < e.naive_lower);
  CHECK(e.repeated_upper > e.naive_upper);
}

TEST_CASE("early stop: no stop, or a crossing only at the final look, is not an early stop") {
  CHECK(!ComputeEarlyStop(Looks({{0.5, 6, 4}}, -1)).present);
  auto looks = Looks({{0.5, 6, 4}, {1.0, 24, 6}}, 1);
  looks[1].kind = "final";
  CHECK(!ComputeEarlyStop(looks).present);
  CHECK(ComputeEarlyStop({}).present == false);
}
