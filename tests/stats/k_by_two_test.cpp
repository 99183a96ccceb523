// The k x 2 table of independent groups: the trend test (stats/trend.h),
// chi-square and the exact Freeman–Halton test (stats/k_by_two.h) and all
// pairwise comparisons (stats/pairwise.h), against R run live
// (tests/reference/models/klevel.R names each R call).
#include <catch2/catch.hpp>

#include <sstream>

#include "stats/k_by_two.h"
#include "stats/pairwise.h"
#include "stats/r_run.h"
#include "stats/random.h"
#include "stats/trend.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

struct Groups {
  std::vector<int64_t> x, n;
  std::vector<double> score;
};

std::string Tsv(const Groups& g) {
  std::ostringstream o;
  o.precision(17);
  o << "x\tn\tscore\n";
  for (size_t i = 0; i < g.x.size(); ++i) o << g.x[i] << "\t" << g.n[i] << "\t" << g.score[i] << "\n";
  return o.str();
}

void CheckGroups(const Groups& g, stats::Adjustment method) {
  auto r = testing::RunRScript("klevel.R", Tsv(g), "groups " + stats::AdjustmentName(method));
  const auto trend = stats::CochranArmitage(g.x, g.n, g.score);
  CHECK_THAT(trend.statistic, WithinRel(r["trend"][0], 1e-10));  // prop.trend.test(x, n, score)$statistic
  CHECK_THAT(trend.p, WithinRel(r["trend_p"][0], 1e-9));         // ...$p.value
  const auto k = stats::KByTwo(g.x, g.n);
  CHECK_THAT(k.chi2, WithinRel(r["chi2"][0], 1e-10));            // chisq.test(cbind(x, n - x), correct = FALSE)
  CHECK_THAT(k.p_chi2, WithinRel(r["chi2_p"][0], 1e-9));
  REQUIRE(k.p_exact);
  CHECK_THAT(*k.p_exact, WithinRel(r["fisher_p"][0], 1e-8));     // fisher.test(cbind(x, n - x))$p.value
  const auto pairs = stats::PairwiseBetween(g.x, g.n, method);
  REQUIRE(pairs.size() == r["pair_p"].size());
  for (size_t i = 0; i < pairs.size(); ++i) {
    CHECK_THAT(pairs[i].p, WithinRel(r["pair_p"][i], 1e-9));              // fisher.test on each pair's rows
    CHECK_THAT(pairs[i].p_adjusted, WithinRel(r["pair_adjusted"][i], 1e-9));  // p.adjust(..., method)
  }
}

}  // namespace

TEST_CASE("trend: 15, 10 and 5 of 50 at ages 28, 45, 58 agree with R prop.trend.test") {
  // R 4.2.2: prop.trend.test(c(15, 10, 5), c(50, 50, 50), c(28, 45, 58)) gives
  // X-squared = 6.2131811, p = 0.01268026 (printed digits; run live below).
  const auto t = stats::CochranArmitage({15, 10, 5}, {50, 50, 50}, {28, 45, 58});
  CHECK_THAT(t.statistic, WithinAbs(6.2131811, 5e-8));
  CHECK_THAT(t.p, WithinAbs(0.01268026, 5e-9));
  CHECK(t.z < 0);  // rates fall with age
  CheckGroups({{15, 10, 5}, {50, 50, 50}, {28, 45, 58}}, stats::Adjustment::kHolm);
}

TEST_CASE("k by two: random tables of 3 to 5 groups agree with R") {
  stats::Rng rng(424242);
  for (int rep = 0; rep < 6; ++rep) {
    Groups g;
    const int k = static_cast<int>(rng.Between(3, 5));
    for (int i = 0; i < k; ++i) {
      g.n.push_back(rng.Between(5, 40));
      g.x.push_back(rng.Between(0, g.n.back()));
      g.score.push_back(static_cast<double>(i) + rng.Uniform());
    }
    INFO("table " << rep);
    CheckGroups(g, rep % 2 ? stats::Adjustment::kBH : stats::Adjustment::kHolm);
  }
}

TEST_CASE("k by two: no positive at all gives no test, p = 1") {
  const auto k = stats::KByTwo({0, 0, 0}, {10, 12, 9});
  CHECK(k.chi2 == 0);
  CHECK(k.p_chi2 == 1);
  CHECK(k.p_exact == 1.0);
  CHECK_FALSE(stats::CochranArmitage({0, 0, 0}, {10, 12, 9}, {1, 2, 3}).defined);
}

TEST_CASE("k by two: too many tables leaves the exact p out") {
  const auto k = stats::KByTwo({300, 280, 250, 260, 240, 230}, {600, 600, 600, 600, 600, 600});
  CHECK(k.tables > stats::kMaxKByTwoTables);
  CHECK_FALSE(k.p_exact);
}
