// Mid-p intervals for the conditional odds ratio b/c.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "stats/paired_midp.h"
#include "stats/r_eval.h"

using namespace twinprobe;
using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("mid-p odds ratio: the Ezra et al. example of Fagerland, Lydersen and Laake") {
  // Floppy eyelid syndrome and obstructive sleep apnoea, [[7, 25], [2, 68]]
  // (Ezra et al. 2010): b = 25, c = 2, the worked example of Fagerland,
  // Lydersen & Laake (2017), Statistical Analysis of Contingency Tables,
  // chapter 8, for the conditional odds ratio: 12.5, transformed mid-p 95% CI
  // 3.4681 to 78.2972, transformed Clopper–Pearson 3.1169 to 108.8892 (four
  // decimals as printed; also asserted by the R package contingencytables).
  auto e = ConditionalOddsRatioMidP(DiscordantCounts{25, 2}, 0.95);
  CHECK(e.estimate == 12.5);
  CHECK_THAT(e.ci.low, WithinAbs(3.4681, 0.00005));
  CHECK_THAT(e.ci.high, WithinAbs(78.2972, 0.00005));
  auto exact = ConditionalOddsRatio(PairedCounts{7, 25, 2, 68}, 0.95);
  CHECK_THAT(exact.ci.low, WithinAbs(3.1169, 0.00005));
  CHECK_THAT(exact.ci.high, WithinAbs(108.8892, 0.00005));
}

TEST_CASE("mid-p odds ratio: agrees with R's uniroot on the mid-p binomial tails") {
  struct Case {
    int64_t b, c;
    double conf;
    Alternative alt;
    const char* r_alt;
  };
  const Case cases[] = {
      {25, 2, 0.95, Alternative::kTwoSided, "two.sided"}, {0, 7, 0.95, Alternative::kTwoSided, "two.sided"},
      {9, 0, 0.9, Alternative::kTwoSided, "two.sided"},   {150, 86, 0.95, Alternative::kTwoSided, "two.sided"},
      {3, 11, 0.95, Alternative::kLess, "less"},          {14, 4, 0.99, Alternative::kGreater, "greater"},
      {1, 1, 0.95, Alternative::kTwoSided, "two.sided"},  {2400, 2100, 0.95, Alternative::kTwoSided, "two.sided"},
  };
  std::ostringstream program;
  program << "source('" << testing::SourceDir() << "/tests/reference/paired.R')\nv <- c()\n";
  for (const Case& c : cases)
    program << "v <- c(v, midp_or_ci(" << c.b << "," << c.c << "," << c.conf << ",'" << c.r_alt << "'))\n";
  program << "cat(format(v, digits = 17), sep = '\\n')\n";
  auto r = testing::RunR(program.str());
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 2 * std::size(cases));
  size_t i = 0;
  for (const Case& c : cases) {
    INFO("b = " << c.b << ", c = " << c.c);
    auto e = ConditionalOddsRatioMidP(DiscordantCounts{c.b, c.c}, c.conf, c.alt);
    for (double got : {e.ci.low, e.ci.high}) {
      const double want = r.values[i++];
      if (std::isinf(want)) CHECK(std::isinf(got));
      else if (want == 0) CHECK(got == 0);
      else CHECK_THAT(got, WithinRel(want, 1e-9));
    }
  }
}

TEST_CASE("mid-p odds ratio: narrower than the exact interval, inside it") {
  auto mid = ConditionalOddsRatioMidP(DiscordantCounts{150, 86}, 0.95);
  auto exact = ConditionalOddsRatio(PairedCounts{794, 150, 86, 570}, 0.95);
  CHECK(mid.ci.low > exact.ci.low);
  CHECK(mid.ci.high < exact.ci.high);
}

TEST_CASE("mid-p odds ratio: no discordant pair gives no estimate") {
  auto e = ConditionalOddsRatioMidP(DiscordantCounts{0, 0}, 0.95);
  CHECK(std::isnan(e.estimate));
  CHECK(std::isnan(e.ci.low));
}
