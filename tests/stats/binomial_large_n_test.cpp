// Binomial tails and binom.test at 6e8 and 1e9 trials against R, live: the
// incomplete beta lost digits there in double precision (2.2e-8 relative at
// 6e8 before it was promoted to long double above 1e6 trials).
//
// R's binom.test forms its two-sided p by evaluating dbinom at every outcome
// on the far side of the mean (vectors of 3e8 doubles at n = 6e8: gigabytes
// and minutes), so at these n the reference applies binom.test's own
// definition with R's pbinom and dbinom and a binary search for the
// boundary (two_sided below); that function is first checked against
// binom.test itself at 2e7 trials. One-sided p-values are binom.test's own
// (pbinom), and the interval is its qbeta pair.
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
  program << R"(
two_sided <- function(x, n, p) {
  m <- n * p; d <- dbinom(x, n, p, log = TRUE) + log1p(1e-7)
  if (x == m) return(1)
  if (x < m) {  # first i in [ceiling(m), n] no more likely than x
    lo <- ceiling(m); hi <- n + 1
    while (lo < hi) { mid <- lo + (hi - lo) %/% 2; if (dbinom(mid, n, p, log = TRUE) <= d) hi <- mid else lo <- mid + 1 }
    return(pbinom(x, n, p) + pbinom(lo - 1, n, p, lower.tail = FALSE))
  }
  lo <- -1; hi <- floor(m)  # last i in [0, floor(m)] no more likely than x
  while (lo < hi) { mid <- lo + (hi - lo + 1) %/% 2; if (dbinom(mid, n, p, log = TRUE) <= d) lo <- mid else hi <- mid - 1 }
  pbinom(lo, n, p) + pbinom(x - 1, n, p, lower.tail = FALSE)
}
v <- c(two_sided(9995000, 2e7, 0.5), binom.test(9995000, 2e7, 0.5)$p.value,
       two_sided(2001500, 2e7, 0.1), binom.test(2001500, 2e7, 0.1)$p.value)
)";
  for (const Case& c : kCases) {
    program << "x <- " << c.x << "; n <- " << c.n << "; p0 <- " << c.p0 << "\n"
            << "v <- c(v, pbinom(x, n, p0), pbinom(x - 1, n, p0, lower.tail = FALSE), two_sided(x, n, p0),\n"
            << "  binom.test(x, n, p0, alternative = 'less')$p.value, binom.test(x, n, p0, alternative = 'greater')$p.value,\n"
            << "  qbeta(0.025, x, n - x + 1), qbeta(0.975, x + 1, n - x))\n";
  }
  program << "cat(format(v, digits = 17), sep = '\\n')\n";
  auto r = testing::RunR(program.str());
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 4 + 7 * std::size(kCases));
  // The reference's two-sided p is binom.test's where binom.test can run.
  CHECK_THAT(r.values[0], WithinRel(r.values[1], 1e-12));
  CHECK_THAT(r.values[2], WithinRel(r.values[3], 1e-12));
  CHECK_THAT(BinomTest(9'995'000, 20'000'000, 0.5, Alternative::kTwoSided, 0.95).p.p, WithinRel(r.values[1], 1e-9));
  CHECK_THAT(BinomTest(2'001'500, 20'000'000, 0.1, Alternative::kTwoSided, 0.95).p.p, WithinRel(r.values[3], 1e-9));
  size_t i = 4;
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
