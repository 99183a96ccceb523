// Binomial tails and binom.test at 6e8 and 1e9 trials against R, live: the
// incomplete beta lost digits there in double precision (2.2e-8 relative at
// 6e8 before it was promoted to long double above 1e6 trials).
#include <catch2/catch.hpp>

#include <sstream>

#include "stats/binomial.h"
#include "stats/r_eval.h"

using namespace twinprobe;
using namespace twinprobe::stats;
using Catch::Matchers::WithinRel;

namespace {

struct Case {
  int64_t x, n;
  double p0;
};

// Counts near the mean and in the tails (down to ~1e-16), at 6e8 and 1e9.
const Case kCases[] = {
    {299'990'000, 600'000'000, 0.5}, {299'999'000, 600'000'000, 0.5}, {300'010'000, 600'000'000, 0.5},
    {299'900'000, 600'000'000, 0.5}, {180'010'000, 600'000'000, 0.3}, {499'960'000, 1'000'000'000, 0.5},
    {100'003'000, 1'000'000'000, 0.1}, {250'000'000, 1'000'000'000, 0.25},
};

}  // namespace

TEST_CASE("binomial: tails and binom.test agree with R to 1e-9 at 6e8 and 1e9 trials") {
  std::ostringstream program;
  program << "v <- c()\n";
  for (const Case& c : kCases) {
    program << "x <- " << c.x << "; n <- " << c.n << "; p0 <- " << c.p0 << "\n"
            << "v <- c(v, pbinom(x, n, p0), pbinom(x - 1, n, p0, lower.tail = FALSE),\n"
            << "  binom.test(x, n, p0)$p.value, binom.test(x, n, p0, alternative = 'less')$p.value,\n"
            << "  binom.test(x, n, p0, alternative = 'greater')$p.value, binom.test(x, n, p0)$conf.int)\n";
  }
  program << "cat(format(v, digits = 17), sep = '\\n')\n";
  auto r = testing::RunR(program.str());
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 7 * std::size(kCases));
  size_t i = 0;
  for (const Case& c : kCases) {
    INFO("x = " << c.x << ", n = " << c.n << ", p0 = " << c.p0);
    CHECK_THAT(BinomCdf(c.x, c.n, c.p0), WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(std::exp(LogBinomTail(c.x, c.n, c.p0, true)), WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(BinomTest(c.x, c.n, c.p0, Alternative::kTwoSided, 0.95).p.p, WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(BinomTest(c.x, c.n, c.p0, Alternative::kLess, 0.95).p.p, WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(BinomTest(c.x, c.n, c.p0, Alternative::kGreater, 0.95).p.p, WithinRel(r.values[i++], 1e-9));
    const Interval ci = BinomTest(c.x, c.n, c.p0, Alternative::kTwoSided, 0.95).ci;
    CHECK_THAT(ci.low, WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(ci.high, WithinRel(r.values[i++], 1e-9));
  }
}
