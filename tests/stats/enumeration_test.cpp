// Exact methods against brute-force enumeration of every table on small
// margins (the slow oracle: every probability summed from C(n, k) counts).
#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

#include "stats/binomial.h"
#include "stats/conditional_or.h"
#include "stats/exact_stratified.h"
#include "stats/fisher.h"
#include "stats/mcnemar.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinRel;

namespace {

double Choose(int n, int k) {
  if (k < 0 || k > n) return 0;
  double c = 1;
  for (int i = 1; i <= k; ++i) c = c * (n - k + i) / i;
  return c;
}

// P(a) for every a given margins, by counting.
std::vector<double> HyperPmf(int m, int n, int k, int lo, int hi) {
  std::vector<double> d;
  for (int a = lo; a <= hi; ++a) d.push_back(Choose(m, a) * Choose(n, k - a) / Choose(m + n, k));
  return d;
}

double SumWhere(const std::vector<double>& d, double limit) {
  double s = 0;
  for (double v : d)
    if (v <= limit) s += v;
  return s;
}

}  // namespace

TEST_CASE("enumeration: Fisher p-values of every 2x2 table with n <= 14") {
  int tables = 0;
  for (int a = 0; a <= 5; ++a)
    for (int b = 0; b <= 4; ++b)
      for (int c = 0; c <= 4; ++c)
        for (int d = 0; d <= 4; ++d) {
          const int m = a + c, n = b + d, k = a + b;
          const int lo = std::max(0, k - n), hi = std::min(k, m);
          auto pmf = HyperPmf(m, n, k, lo, hi);
          double less = 0, greater = 0;
          for (int s = lo; s <= hi; ++s) (s <= a ? less : greater) += pmf[s - lo];
          greater += pmf[a - lo];
          const double two = std::min(1.0, SumWhere(pmf, pmf[a - lo] * (1 + 1e-7)));
          Table2x2 t{a, b, c, d};
          CHECK_THAT(FisherTest(t, Alternative::kLess, 0.95).p.p, WithinRel(less, 1e-12));
          CHECK_THAT(FisherTest(t, Alternative::kGreater, 0.95).p.p, WithinRel(greater, 1e-12));
          CHECK_THAT(FisherTest(t, Alternative::kTwoSided, 0.95).p.p, WithinRel(two, 1e-12));
          ++tables;
        }
  CHECK(tables == 6 * 5 * 5 * 5);
}

TEST_CASE("enumeration: binomial two-sided p for every x with n <= 25 and several p0") {
  for (double p0 : {0.5, 0.3, 0.75, 0.1})
    for (int n = 1; n <= 25; ++n) {
      std::vector<double> pmf;
      for (int i = 0; i <= n; ++i) pmf.push_back(Choose(n, i) * std::pow(p0, i) * std::pow(1 - p0, n - i));
      for (int x = 0; x <= n; ++x) {
        double expected = std::min(1.0, SumWhere(pmf, pmf[x] * (1 + 1e-7)));
        if (x == n * p0) expected = 1;
        CHECK_THAT(BinomTest(x, n, p0, Alternative::kTwoSided, 0.95).p.p, WithinRel(expected, 1e-11));
      }
    }
}

TEST_CASE("enumeration: McNemar mid-p equals the enumerated definition") {
  for (int b = 0; b <= 15; ++b)
    for (int c = 0; c <= 15; ++c) {
      if (b + c == 0) continue;
      const int n = b + c, k = std::min(b, c);
      double below = 0;
      for (int i = 0; i < k; ++i) below += Choose(n, i) / std::pow(2.0, n);
      const double at = Choose(n, k) / std::pow(2.0, n);
      double mid = b == c ? 1 - 0.5 * at : 2 * below + at;
      CHECK_THAT(McNemar(PairedCounts{0, b, c, 0}).mid_p.p, WithinRel(mid, 1e-12));
    }
}

TEST_CASE("enumeration: exact stratified test equals enumeration over every combination of strata") {
  // Three strata: the distribution of S = a1 + a2 + a3 by enumerating every
  // (a1, a2, a3) in the product of the supports.
  std::vector<Table2x2> strata{{2, 3, 1, 4}, {3, 0, 2, 2}, {1, 2, 4, 1}};
  std::vector<std::vector<double>> pmfs;
  std::vector<int> los;
  int lo_sum = 0, hi_sum = 0, observed = 0;
  for (const auto& t : strata) {
    int m = int(t.a + t.c), n = int(t.b + t.d), k = int(t.a + t.b);
    int lo = std::max(0, k - n), hi = std::min(k, m);
    pmfs.push_back(HyperPmf(m, n, k, lo, hi));
    los.push_back(lo);
    lo_sum += lo, hi_sum += hi, observed += int(t.a);
  }
  std::vector<double> dist(hi_sum - lo_sum + 1, 0.0);
  for (size_t i = 0; i < pmfs[0].size(); ++i)
    for (size_t j = 0; j < pmfs[1].size(); ++j)
      for (size_t l = 0; l < pmfs[2].size(); ++l)
        dist[i + j + l] += pmfs[0][i] * pmfs[1][j] * pmfs[2][l];
  const double two = SumWhere(dist, dist[observed - lo_sum] * (1 + 1e-7));
  double less = 0, greater = 0;
  for (int s = lo_sum; s <= hi_sum; ++s) {
    if (s <= observed) less += dist[s - lo_sum];
    if (s >= observed) greater += dist[s - lo_sum];
  }
  CHECK_THAT(ExactCommonOddsRatio(strata, Alternative::kTwoSided, 0.95)->p.p, WithinRel(two, 1e-12));
  CHECK_THAT(ExactCommonOddsRatio(strata, Alternative::kLess, 0.95)->p.p, WithinRel(less, 1e-12));
  CHECK_THAT(ExactCommonOddsRatio(strata, Alternative::kGreater, 0.95)->p.p, WithinRel(greater, 1e-12));
  // The conditional MLE solves E[S; psi] = s_obs on the enumerated distribution.
  double psi = ExactCommonOddsRatio(strata, Alternative::kTwoSided, 0.95)->estimate;
  double num = 0, den = 0;
  for (int s = lo_sum; s <= hi_sum; ++s) {
    double w = dist[s - lo_sum] * std::pow(psi, s);
    num += s * w, den += w;
  }
  CHECK_THAT(num / den, WithinRel(double(observed), 1e-12));
}

TEST_CASE("enumeration: the conditional interval limits solve their tail equations") {
  // Tea tasting margins: P(A >= 3; psi_L) = 0.025 and P(A <= 3; psi_U) = 0.025.
  FisherResult r = FisherTest({3, 1, 1, 3}, Alternative::kTwoSided, 0.95);
  auto pmf = HyperPmf(4, 4, 4, 0, 4);
  auto tail = [&](double psi, bool upper) {
    double num = 0, den = 0;
    for (int s = 0; s <= 4; ++s) {
      double w = pmf[s] * std::pow(psi, s);
      den += w;
      if (upper ? s >= 3 : s <= 3) num += w;
    }
    return num / den;
  };
  CHECK_THAT(tail(r.ci.low, true), WithinRel(0.025, 1e-12));
  CHECK_THAT(tail(r.ci.high, false), WithinRel(0.025, 1e-12));
}
