#include "stats/wilcoxon.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <limits>
#include <map>
#include <numeric>

namespace twinprobe::stats {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double PNormLower(double z) { return 0.5 * std::erfc(-z / std::sqrt(2.0)); }
double PNormUpper(double z) { return 0.5 * std::erfc(z / std::sqrt(2.0)); }

// Null distribution of V for n non-zero, untied differences: P(V = s),
// s = 0 .. n(n+1)/2. Each rank enters with probability 1/2; halving at every
// step keeps the numbers in range (R's csignrank counts subsets instead).
std::vector<double> SignRankPmf(int64_t n) {
  const size_t top = static_cast<size_t>(n * (n + 1) / 2);
  std::vector<double> w(top + 1, 0.0);
  w[0] = 1.0;
  size_t reach = 0;
  for (int64_t k = 1; k <= n; ++k) {
    const size_t uk = static_cast<size_t>(k);
    reach += uk;
    for (size_t s = reach + 1; s-- > 0;) w[s] = 0.5 * (w[s] + (s >= uk ? w[s - uk] : 0.0));
  }
  return w;
}

// Null distribution of the Mann-Whitney statistic for sizes m, n:
// P_{m,n}(u) = m/(m+n) P_{m-1,n}(u-n) + n/(m+n) P_{m,n-1}(u) (the largest
// pooled value belongs to x with probability m/(m+n) and then exceeds all n
// of y). Every term is non-negative, so small tails keep their relative
// accuracy. Rows are rolled over m'; memory ~ m n^2 / 2 doubles.
std::vector<double> RankSumPmf(int64_t m, int64_t n) {
  std::vector<std::vector<double>> prev(static_cast<size_t>(n + 1)), cur(static_cast<size_t>(n + 1));
  for (auto& p : prev) p = {1.0};  // m' = 0: U = 0
  for (int64_t mi = 1; mi <= m; ++mi) {
    cur[0] = {1.0};  // n' = 0: U = 0
    for (int64_t ni = 1; ni <= n; ++ni) {
      const size_t size = static_cast<size_t>(mi * ni + 1);
      std::vector<double> d(size, 0.0);
      const double px = static_cast<double>(mi) / static_cast<double>(mi + ni);
      const auto& from_x = prev[static_cast<size_t>(ni)];     // P_{mi-1, ni}, shifted by ni
      const auto& from_y = cur[static_cast<size_t>(ni - 1)];  // P_{mi, ni-1}
      for (size_t u = 0; u < from_x.size(); ++u) d[u + static_cast<size_t>(ni)] += px * from_x[u];
      for (size_t u = 0; u < from_y.size(); ++u) d[u] += (1.0 - px) * from_y[u];
      cur[static_cast<size_t>(ni)] = std::move(d);
    }
    std::swap(prev, cur);
  }
  return prev[static_cast<size_t>(n)];
}

// Sum of pmf[s] for s <= q (lower) or s >= q (upper), q an index.
double LowerTail(const std::vector<double>& pmf, double q) {
  double x = std::floor(q + 1e-7);  // as R's psignrank / pwilcox
  if (x < 0) return 0.0;
  if (x >= static_cast<double>(pmf.size() - 1)) return 1.0;
  double s = 0;
  for (size_t i = 0; i <= static_cast<size_t>(x); ++i) s += pmf[i];
  return std::min(1.0, s);
}
double UpperTail(const std::vector<double>& pmf, double q) {  // P(X >= q)
  double x = std::ceil(q - 1e-7);
  if (x <= 0) return 1.0;
  if (x > static_cast<double>(pmf.size() - 1)) return 0.0;
  double s = 0;
  for (size_t i = static_cast<size_t>(x); i < pmf.size(); ++i) s += pmf[i];
  return std::min(1.0, s);
}

// p-value from an exact pmf with R's rules (two-sided doubles the smaller
// side chosen by comparing the statistic with the centre).
double ExactP(const std::vector<double>& pmf, double stat, double centre, Alternative alt) {
  switch (alt) {
    case Alternative::kGreater:
      return UpperTail(pmf, stat);
    case Alternative::kLess:
      return LowerTail(pmf, stat);
    case Alternative::kTwoSided:
      break;
  }
  double p = stat > centre ? UpperTail(pmf, stat) : LowerTail(pmf, stat);
  return std::min(1.0, 2.0 * p);
}

double NormalP(double z_raw, double sigma, Alternative alt, bool correct, double& z_out) {
  double correction = 0;
  if (correct) {
    if (alt == Alternative::kTwoSided) correction = z_raw > 0 ? 0.5 : (z_raw < 0 ? -0.5 : 0.0);
    else correction = alt == Alternative::kGreater ? 0.5 : -0.5;
  }
  double z = (z_raw - correction) / sigma;
  z_out = z;
  switch (alt) {
    case Alternative::kLess:
      return PNormLower(z);
    case Alternative::kGreater:
      return PNormUpper(z);
    case Alternative::kTwoSided:
      break;
  }
  return 2.0 * std::min(PNormLower(z), PNormUpper(z));
}

// Sum over tie groups of t^3 - t (average ranks: tied values share a rank).
double TieSum(const std::vector<double>& ranks) {
  std::map<double, int64_t> count;
  for (double r : ranks) ++count[r];
  double s = 0;
  for (const auto& [r, t] : count) s += static_cast<double>(t) * static_cast<double>(t) * static_cast<double>(t) -
                                        static_cast<double>(t);
  return s;
}

// A total order on doubles as unsigned integers (for bisection over every
// representable value).
uint64_t Key(double x) {
  uint64_t b;
  std::memcpy(&b, &x, sizeof b);
  return (b >> 63) ? ~b : (b | (uint64_t{1} << 63));
}
double FromKey(uint64_t k) {
  uint64_t b = (k >> 63) ? (k & ~(uint64_t{1} << 63)) : ~k;
  double x;
  std::memcpy(&x, &b, sizeof x);
  return x;
}

// The k-th smallest (1-based) of a set of pair values that are never
// materialised: `count(t)` = number of values <= t (monotone in t), and the
// answer is the smallest double t with count(t) >= k. Bisection over the
// doubles' bit patterns takes at most 64 counting passes.
template <typename Count>
double KthSmallest(int64_t k, double lo, double hi, Count count) {
  uint64_t a = Key(lo), b = Key(hi);  // count(FromKey(b)) >= k
  if (count(FromKey(a)) >= k) return FromKey(a);
  while (b - a > 1) {
    uint64_t mid = a + (b - a) / 2;
    if (count(FromKey(mid)) >= k) b = mid;
    else a = mid;
  }
  return FromKey(b);
}

// Median of the Walsh averages (a_i + a_j)/2, i <= j; `a` sorted ascending.
double WalshMedian(const std::vector<double>& a) {
  const int64_t n = static_cast<int64_t>(a.size());
  if (n == 0) return kNaN;
  auto count = [&](double t) {
    int64_t total = 0, j = n - 1;
    for (int64_t i = 0; i < n; ++i) {
      while (j >= 0 && (a[static_cast<size_t>(i)] + a[static_cast<size_t>(j)]) / 2 > t) --j;
      if (j < i) break;
      total += j - i + 1;
    }
    return total;
  };
  const int64_t pairs = n * (n + 1) / 2;
  const double lo = a.front(), hi = a.back();
  double upper = KthSmallest(pairs / 2 + 1, lo, hi, count);
  if (pairs % 2 == 1) return upper;
  return (KthSmallest(pairs / 2, lo, hi, count) + upper) / 2;
}

// Median of all x_i - y_j; both sorted ascending.
double ShiftMedian(const std::vector<double>& x, const std::vector<double>& y) {
  const int64_t m = static_cast<int64_t>(x.size()), n = static_cast<int64_t>(y.size());
  auto count = [&](double t) {
    int64_t total = 0, j = 0;
    for (int64_t i = 0; i < m; ++i) {
      while (j < n && x[static_cast<size_t>(i)] - y[static_cast<size_t>(j)] > t) ++j;
      total += n - j;
    }
    return total;
  };
  const int64_t pairs = m * n;
  const double lo = x.front() - y.back(), hi = x.back() - y.front();
  double upper = KthSmallest(pairs / 2 + 1, lo, hi, count);
  if (pairs % 2 == 1) return upper;
  return (KthSmallest(pairs / 2, lo, hi, count) + upper) / 2;
}

// Exact rank-sum tables above this many cells are refused (the recursion's
// memory is about m * n * min(m, n) / 2 doubles).
constexpr double kMaxRankSumCells = 2e7;

}  // namespace

std::vector<double> AverageRanks(const std::vector<double>& values) {
  std::vector<size_t> order(values.size());
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(), [&](size_t a, size_t b) { return values[a] < values[b]; });
  std::vector<double> ranks(values.size());
  for (size_t i = 0; i < order.size();) {
    size_t j = i;
    while (j + 1 < order.size() && values[order[j + 1]] == values[order[i]]) ++j;
    double r = (static_cast<double>(i + 1) + static_cast<double>(j + 1)) / 2.0;
    for (size_t k = i; k <= j; ++k) ranks[order[k]] = r;
    i = j + 1;
  }
  return ranks;
}

double PSignRank(double q, int64_t n) { return LowerTail(SignRankPmf(n), q); }
double PWilcox(double q, int64_t m, int64_t n) { return LowerTail(RankSumPmf(m, n), q); }

RankTestResult WilcoxonSignedRank(const std::vector<double>& d, Alternative alternative, RankMethod method,
                                  bool correct) {
  RankTestResult r;
  std::vector<double> nz;
  for (double x : d) {
    if (x == 0) ++r.zeros;
    else nz.push_back(x);
  }
  const int64_t n = static_cast<int64_t>(nz.size());
  r.n = n;
  std::vector<double> abs_d(nz.size());
  for (size_t i = 0; i < nz.size(); ++i) abs_d[i] = std::fabs(nz[i]);
  std::vector<double> ranks = AverageRanks(abs_d);
  for (size_t i = 0; i < nz.size(); ++i)
    if (nz[i] > 0) r.statistic += ranks[i];
  const double tie_sum = TieSum(ranks);
  r.ties = tie_sum > 0;
  bool want_exact = method == RankMethod::kExact || (method == RankMethod::kAuto && n < 50);
  const double nd = static_cast<double>(n);
  if (want_exact && !r.ties && r.zeros == 0) {
    r.exact = true;
    r.p_value = ExactP(SignRankPmf(n), r.statistic, nd * (nd + 1) / 4, alternative);
  } else {
    r.exact_refused = want_exact;
    double sigma = std::sqrt(nd * (nd + 1) * (2 * nd + 1) / 24 - tie_sum / 48);
    r.p_value = NormalP(r.statistic - nd * (nd + 1) / 4, sigma, alternative, correct, r.z);
  }
  std::sort(nz.begin(), nz.end());
  r.estimate = WalshMedian(nz);
  return r;
}

RankTestResult MannWhitney(const std::vector<double>& x, const std::vector<double>& y, Alternative alternative,
                           RankMethod method, bool correct) {
  RankTestResult r;
  const double m = static_cast<double>(x.size()), n = static_cast<double>(y.size());
  std::vector<double> pooled(x);
  pooled.insert(pooled.end(), y.begin(), y.end());
  std::vector<double> ranks = AverageRanks(pooled);
  double rank_sum_x = 0;
  for (size_t i = 0; i < x.size(); ++i) rank_sum_x += ranks[i];
  r.statistic = rank_sum_x - m * (m + 1) / 2;
  r.n = static_cast<int64_t>(pooled.size());
  const double tie_sum = TieSum(ranks);
  r.ties = tie_sum > 0;
  bool want_exact = method == RankMethod::kExact || (method == RankMethod::kAuto && m < 50 && n < 50);
  bool feasible = m * n * std::min(m, n) / 2 <= kMaxRankSumCells;
  if (want_exact && !r.ties && feasible) {
    r.exact = true;
    r.p_value = ExactP(RankSumPmf(static_cast<int64_t>(m), static_cast<int64_t>(n)), r.statistic, m * n / 2,
                       alternative);
  } else {
    r.exact_refused = want_exact;
    double sigma = std::sqrt((m * n / 12) * ((m + n + 1) - tie_sum / ((m + n) * (m + n - 1))));
    r.p_value = NormalP(r.statistic - m * n / 2, sigma, alternative, correct, r.z);
  }
  std::vector<double> xs(x), ys(y);
  std::sort(xs.begin(), xs.end());
  std::sort(ys.begin(), ys.end());
  r.estimate = ShiftMedian(xs, ys);
  return r;
}

SignTestResult SignTest(const std::vector<double>& d, Alternative alternative) {
  SignTestResult s;
  for (double x : d) {
    if (x > 0) ++s.positive;
    else if (x < 0) ++s.negative;
    else ++s.zeros;
  }
  const int64_t n = s.positive + s.negative;
  if (n == 0) return s;
  switch (alternative) {
    case Alternative::kGreater:
      s.p_value = BinomCdf(n - s.positive, n, 0.5);  // P(X >= k) = P(X <= n - k) at p = 1/2
      break;
    case Alternative::kLess:
      s.p_value = BinomCdf(s.positive, n, 0.5);
      break;
    case Alternative::kTwoSided:
      s.p_value = 2 * s.positive == n ? 1.0 : std::min(1.0, 2.0 * BinomCdf(std::min(s.positive, s.negative), n, 0.5));
      break;
  }
  return s;
}

}  // namespace twinprobe::stats
