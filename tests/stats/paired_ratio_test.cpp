// The callback-rate ratio (a+b)/(a+c) with Bonett & Price's interval.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "stats/paired_ratio.h"
#include "stats/r_eval.h"
#include "stats/random.h"

using namespace twinprobe;
using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("callback ratio: the Cavo et al. example of Fagerland, Lydersen and Laake") {
  // Complete response before (rows) and after (columns) consolidation
  // therapy, [[59, 6], [16, 80]] (Cavo et al. 2012), the worked example of
  // Fagerland, Lydersen & Laake (2017), Statistical Analysis of Contingency
  // Tables, chapter 8, for the ratio of paired probabilities: estimate
  // 0.8667, Bonett–Price hybrid Wilson score 95% CI 0.7579 to 0.9910 (four
  // decimals as printed there; the same values are asserted by the R package
  // contingencytables' tests). Bonett & Price's own paper was not at hand.
  auto e = CallbackRatio(PairedCounts{59, 6, 16, 80}, 0.95);
  CHECK_THAT(e.estimate, WithinRel(65.0 / 75.0, 1e-15));
  CHECK_THAT(e.ci.low, WithinAbs(0.7579, 0.00005));
  CHECK_THAT(e.ci.high, WithinAbs(0.9910, 0.00005));
}

TEST_CASE("callback ratio: agrees with R written from Bonett and Price's formula on random tables") {
  Rng rng(2006);
  std::vector<PairedCounts> tables;
  const char* alts[] = {"two.sided", "less", "greater"};
  for (int i = 0; i < 30; ++i) tables.push_back({rng.Between(0, 60), rng.Between(0, 30), rng.Between(0, 30), rng.Between(0, 200)});
  tables.push_back({0, 3, 0, 10});  // the other arm never called back: infinite upper limit
  std::ostringstream program;
  program << "source('" << testing::SourceDir() << "/tests/reference/paired.R')\nv <- c()\n";
  for (size_t i = 0; i < tables.size(); ++i) {
    const auto& t = tables[i];
    program << "v <- c(v, bonett_price_ratio(" << t.a << "," << t.b << "," << t.c << ", 0.9, '" << alts[i % 3] << "'))\n";
  }
  program << "cat(format(v, digits = 17), sep = '\\n')\n";
  auto r = testing::RunR(program.str());
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 2 * tables.size());
  const Alternative alt[] = {Alternative::kTwoSided, Alternative::kLess, Alternative::kGreater};
  for (size_t i = 0; i < tables.size(); ++i) {
    const auto& t = tables[i];
    INFO(t.a << "," << t.b << "," << t.c << "," << t.d << " alternative " << i % 3);
    auto e = CallbackRatio(t, 0.9, alt[i % 3]);
    for (int k = 0; k < 2; ++k) {
      const double want = r.values[2 * i + k], got = k == 0 ? e.ci.low : e.ci.high;
      if (std::isinf(want)) CHECK(std::isinf(got));
      else CHECK_THAT(got, WithinRel(want, 1e-12) || WithinAbs(want, 1e-300));
    }
  }
}

TEST_CASE("callback ratio: no pair with a callback gives no estimate") {
  auto e = CallbackRatio(PairedCounts{0, 0, 0, 12}, 0.95);
  CHECK(std::isnan(e.estimate));
  CHECK(e.ci.low == 0);
  CHECK(std::isinf(e.ci.high));
}
