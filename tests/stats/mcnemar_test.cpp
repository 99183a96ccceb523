#include <catch2/catch.hpp>

#include "stats/binomial.h"
#include "stats/mcnemar.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinRel;

TEST_CASE("mcnemar: Agresti's presidential approval table, exact p") {
  // Agresti (2002), Categorical Data Analysis, 2nd ed., section 10.1: approval
  // of the Prime Minister in two surveys, n = 1600; discordant 150 and 86.
  // Exact p = 2 * pbinom(86, 236, 0.5) = 3.7159e-05 (R 4.2.2:
  // binom.test(86, 236)$p.value = 3.71593614e-05).
  PairedCounts t{794, 150, 86, 570};
  CHECK_THAT(McNemarExactP(t), WithinRel(3.7159e-05, 1e-4));
}

TEST_CASE("mcnemar: all pairs concordant gives p = 1") {
  CHECK(McNemarExactP(PairedCounts{10, 0, 0, 30}) == 1.0);
}

TEST_CASE("mcnemar: exact p equals brute-force enumeration for small discordant counts") {
  for (int b = 0; b <= 12; ++b)
    for (int c = 0; c <= 12; ++c) {
      if (b + c == 0) continue;
      int n = b + c, k = std::min(b, c);
      double tail = 0, choose = 1;  // sum_{i<=k} C(n,i) / 2^n
      for (int i = 0; i <= k; ++i) {
        if (i > 0) choose = choose * (n - i + 1) / i;
        tail += choose;
      }
      double expected = std::min(1.0, 2.0 * tail / std::pow(2.0, n));
      CHECK_THAT(McNemarExactP(PairedCounts{0, b, c, 0}), WithinRel(expected, 1e-12));
    }
}

TEST_CASE("binomial: Clopper-Pearson interval of binom.test(682, 925)") {
  // R: binom.test(682, 925, p = 3/4) (Conover 1971, in R's binom.test help):
  // 95 percent CI 0.7076683 0.7654066 (R 4.2.2 output).
  Interval ci = ClopperPearson(682, 925, 0.95);
  CHECK_THAT(ci.low, WithinRel(0.7076683, 1e-6));
  CHECK_THAT(ci.high, WithinRel(0.7654066, 1e-6));
}

TEST_CASE("binomial: Clopper-Pearson at the edges x = 0 and x = n") {
  Interval zero = ClopperPearson(0, 10, 0.95);
  CHECK(zero.low == 0.0);
  CHECK_THAT(zero.high, WithinRel(0.3084971, 1e-6));  // 1 - 0.025^(1/10)
  Interval all = ClopperPearson(10, 10, 0.95);
  CHECK(all.high == 1.0);
  CHECK_THAT(all.low, WithinRel(1 - 0.3084971, 1e-6));
}
