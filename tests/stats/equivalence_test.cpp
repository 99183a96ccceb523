// Tango's score interval and the two one-sided score tests for equivalence.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "stats/equivalence.h"
#include "stats/r_eval.h"
#include "stats/random.h"

using namespace twinprobe;
using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("equivalence: Tango's interval on the Cavo et al. example of Fagerland, Lydersen and Laake") {
  // [[59, 6], [16, 80]] (Cavo et al. 2012), the worked example of Fagerland,
  // Lydersen & Laake (2017), Statistical Analysis of Contingency Tables,
  // chapter 8, for the difference of paired probabilities: estimate -0.0621,
  // Tango asymptotic score 95% CI -0.1240 to -0.0054 (four decimals as
  // printed; also asserted by the R package contingencytables).
  auto e = TangoInterval(PairedCounts{59, 6, 16, 80}, 0.95);
  CHECK_THAT(e.estimate, WithinAbs(-0.0621, 0.00005));
  CHECK_THAT(e.ci.low, WithinAbs(-0.1240, 0.00005));
  CHECK_THAT(e.ci.high, WithinAbs(-0.0054, 0.00005));
}

TEST_CASE("equivalence: score tests and interval agree with R written from Tango's and Liu et al.'s formulas") {
  Rng rng(2002);
  std::vector<PairedCounts> tables;
  for (int i = 0; i < 25; ++i) tables.push_back({rng.Between(0, 80), rng.Between(0, 20), rng.Between(0, 20), rng.Between(0, 120)});
  tables.push_back({0, 5, 0, 0});  // b - c = n: the upper limit is 1
  std::ostringstream program;
  program << "source('" << testing::SourceDir() << "/tests/reference/paired.R')\nv <- c()\n";
  for (const auto& t : tables)
    program << "v <- c(v, tango_ci(" << t.b << "," << t.c << "," << t.n() << ", 0.9), tost_score(" << t.b << "," << t.c
            << "," << t.n() << ", -0.1, 0.15))\n";
  program << "cat(format(v, digits = 17), sep = '\\n')\n";
  auto r = testing::RunR(program.str());
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 5 * tables.size());
  size_t i = 0;
  for (const auto& t : tables) {
    INFO(t.a << "," << t.b << "," << t.c << "," << t.d);
    auto ci = TangoInterval(t, 0.9).ci;
    auto eq = PairedEquivalence(t, -0.1, 0.15, 0.05);
    // uniroot stops within 1e-15 absolute on the delta scale.
    CHECK_THAT(ci.low, WithinAbs(r.values[i++], 1e-12));
    CHECK_THAT(ci.high, WithinAbs(r.values[i++], 1e-12));
    CHECK_THAT(eq.p_lower.p, WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(eq.p_upper.p, WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(eq.p.p, WithinRel(r.values[i++], 1e-9));
    // The decision from the p-value and from the 90% interval are the same.
    CHECK(eq.equivalent == (eq.ci.low > -0.1 && eq.ci.high < 0.15));
  }
}

TEST_CASE("equivalence: a large balanced study is shown equivalent within 5 points, a small one is not") {
  auto big = PairedEquivalence(PairedCounts{300, 40, 42, 618}, -0.05, 0.05, 0.05);
  CHECK(big.equivalent);
  CHECK(big.p.p < 0.05);
  auto small = PairedEquivalence(PairedCounts{6, 4, 4, 16}, -0.05, 0.05, 0.05);
  CHECK_FALSE(small.equivalent);
  CHECK(small.p.p > 0.05);
}
