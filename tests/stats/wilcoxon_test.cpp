#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

#include "stats/wilcoxon.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// Brute force: P(V <= q) by enumerating all 2^n sign patterns of ranks 1..n.
double EnumerateSignRank(double q, int n) {
  int64_t hits = 0;
  for (int64_t mask = 0; mask < (int64_t{1} << n); ++mask) {
    int s = 0;
    for (int k = 0; k < n; ++k)
      if (mask & (int64_t{1} << k)) s += k + 1;
    if (s <= q) ++hits;
  }
  return static_cast<double>(hits) / std::pow(2.0, n);
}

// Brute force: P(W <= q) by enumerating every choice of m ranks out of m + n.
double EnumerateRankSum(double q, int m, int n) {
  int64_t hits = 0, total = 0;
  for (int64_t mask = 0; mask < (int64_t{1} << (m + n)); ++mask) {
    if (__builtin_popcountll(static_cast<unsigned long long>(mask)) != m) continue;
    int s = 0;
    for (int k = 0; k < m + n; ++k)
      if (mask & (int64_t{1} << k)) s += k + 1;
    ++total;
    if (s - m * (m + 1) / 2 <= q) ++hits;
  }
  return static_cast<double>(hits) / static_cast<double>(total);
}

const std::vector<double> kCureton = {6, 8, 14, 16, 23, 24, 28, 29, 41, -48, 49, 56, 60, -67, 75};

}  // namespace

TEST_CASE("wilcoxon: Darwin's Zea mays differences (Cureton) give V = 96, exact p = 0.041259765625") {
  // Darwin's paired plant heights as tabulated by
  // Cureton; exact p 0.041259765625 (also R 4.2.2: wilcox.test(d)$p.value).
  RankTestResult r = WilcoxonSignedRank(kCureton);
  CHECK(r.statistic == 96);
  CHECK(r.exact);
  CHECK_THAT(r.p_value, WithinRel(0.041259765625, 1e-12));
}

TEST_CASE("wilcoxon: Cureton differences with the normal approximation give p = 0.0437723") {
  // R 4.2.2: wilcox.test(d, exact = FALSE)$p.value = 0.0437723237630412
  // (0.04377 to four figures).
  RankTestResult r = WilcoxonSignedRank(kCureton, Alternative::kTwoSided, RankMethod::kNormal);
  CHECK_FALSE(r.exact);
  CHECK_THAT(r.p_value, WithinRel(0.0437723237630412, 1e-10));
}

TEST_CASE("wilcoxon: sign test on the Cureton differences, 13 of 15 positive, p = 0.00738525390625") {
  // R 4.2.2 binom.test(13, 15)$p.value = 0.007385253906.
  SignTestResult s = SignTest(kCureton);
  CHECK(s.positive == 13);
  CHECK(s.negative == 2);
  CHECK_THAT(s.p_value, WithinRel(0.00738525390625, 1e-12));
}

TEST_CASE("wilcoxon: Hollander & Wolfe depression scores, paired, greater: V = 40, p = 0.01953") {
  // Hollander & Wolfe (1973), Nonparametric Statistical Methods, p. 29, as in
  // the examples of R's ?wilcox.test; R 4.2.2 prints V = 40, p-value = 0.01953
  // (= 10/512).
  std::vector<double> x = {1.83, 0.50, 1.62, 2.48, 1.68, 1.88, 1.55, 3.06, 1.30};
  std::vector<double> y = {0.878, 0.647, 0.598, 2.05, 1.06, 1.29, 1.06, 3.14, 1.29};
  std::vector<double> d(x.size());
  for (size_t i = 0; i < x.size(); ++i) d[i] = x[i] - y[i];
  RankTestResult r = WilcoxonSignedRank(d, Alternative::kGreater);
  CHECK(r.statistic == 40);
  CHECK_THAT(r.p_value, WithinRel(10.0 / 512.0, 1e-12));
}

TEST_CASE("wilcoxon: Hollander & Wolfe permeability constants, rank sum, greater: W = 35, p = 0.1272") {
  // Hollander & Wolfe (1973), p. 69, as in R's ?wilcox.test examples;
  // R 4.2.2 prints W = 35, p-value = 0.1272.
  std::vector<double> x = {0.80, 0.83, 1.89, 1.04, 1.45, 1.38, 1.91, 1.64, 0.73, 1.46};
  std::vector<double> y = {1.15, 0.88, 0.90, 0.74, 1.21};
  RankTestResult r = MannWhitney(x, y, Alternative::kGreater);
  CHECK(r.statistic == 35);
  CHECK(r.exact);
  CHECK_THAT(r.p_value, WithinAbs(0.1272, 5e-5));
  CHECK_THAT(r.p_value, WithinRel(1.0 - EnumerateRankSum(34, 10, 5), 1e-12));
}

TEST_CASE("wilcoxon: exact signed-rank distribution equals enumeration for n <= 12") {
  for (int n = 1; n <= 12; ++n)
    for (int q = -1; q <= n * (n + 1) / 2 + 1; ++q) CHECK_THAT(PSignRank(q, n), WithinRel(EnumerateSignRank(q, n), 1e-12));
}

TEST_CASE("wilcoxon: exact rank-sum distribution equals enumeration for m + n <= 13") {
  for (int m = 1; m <= 6; ++m)
    for (int n = 1; n + m <= 13; ++n)
      for (int q = 0; q <= m * n; ++q) CHECK_THAT(PWilcox(q, m, n), WithinRel(EnumerateRankSum(q, m, n), 1e-12));
}

TEST_CASE("wilcoxon: zero differences are dropped and force the normal approximation, as R") {
  std::vector<double> d = {0, 1.5, -0.5, 2, 3, 0, 4.5};
  RankTestResult r = WilcoxonSignedRank(d, Alternative::kTwoSided, RankMethod::kExact);
  CHECK(r.zeros == 2);
  CHECK(r.n == 5);
  CHECK_FALSE(r.exact);
  CHECK(r.exact_refused);
}

TEST_CASE("wilcoxon: every difference zero gives an undefined p-value, as R's NaN") {
  RankTestResult r = WilcoxonSignedRank({0, 0, 0});
  CHECK(std::isnan(r.p_value));
  CHECK(std::isnan(r.estimate));
}

TEST_CASE("wilcoxon: Hodges-Lehmann estimate is the median of the Walsh averages") {
  // d = 1, 2, 4: Walsh averages 1, 1.5, 2, 2.5, 3, 4 -> median (2 + 2.5)/2.
  CHECK(WilcoxonSignedRank({1, 2, 4}).estimate == 2.25);
  // x - y over all pairs: {3,1} - {1}: 2, 0 -> median 1.
  CHECK(MannWhitney({3, 1}, {1}).estimate == 1);
}

TEST_CASE("wilcoxon: average ranks share tied places") {
  std::vector<double> r = AverageRanks({10, 20, 10, 30, 20});
  CHECK(r == std::vector<double>{1.5, 3.5, 1.5, 5, 3.5});
}
