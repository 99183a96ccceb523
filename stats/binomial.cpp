#include "stats/binomial.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/special_functions/beta.hpp>

#include "stats/log_density.h"

namespace twinprobe::stats {
namespace {

constexpr double kRelErr = 1 + 1e-7;  // R's fuzz in binom.test and fisher.test

// Boost promotes double to long double internally by default. In double
// precision the incomplete beta's relative error grows with the parameters
// (about n * 1e-16: 2.2e-8 at n = 6e8, against R's pbinom), so above
// kPromoteAbove trials the long double evaluation (64-bit mantissa, error
// about n * 1e-19, i.e. 1e-10 at n = 1e9) is used; below it double precision
// already gives ~1e-15 and is several times faster.
using FastPolicy = boost::math::policies::policy<boost::math::policies::promote_double<false>>;
using PrecisePolicy = boost::math::policies::policy<boost::math::policies::promote_double<true>>;
constexpr double kPromoteAbove = 1e6;

double Ibeta(double a, double b, double x) {
  return a + b > kPromoteAbove ? boost::math::ibeta(a, b, x, PrecisePolicy()) : boost::math::ibeta(a, b, x, FastPolicy());
}
double Ibetac(double a, double b, double x) {
  return a + b > kPromoteAbove ? boost::math::ibetac(a, b, x, PrecisePolicy()) : boost::math::ibetac(a, b, x, FastPolicy());
}
double Qbeta(double q, double a, double b) {
  return a + b > kPromoteAbove ? boost::math::ibeta_inv(a, b, q, PrecisePolicy()) : boost::math::ibeta_inv(a, b, q, FastPolicy());
}

}  // namespace

Interval ClopperPearson(int64_t x, int64_t n, double conf) {
  return ClopperPearson(x, n, conf, Alternative::kTwoSided);
}

Interval ClopperPearson(int64_t x, int64_t n, double conf, Alternative alternative) {
  const double dx = static_cast<double>(x), dn = static_cast<double>(n);
  auto lower = [&](double alpha) { return x == 0 ? 0.0 : Qbeta(alpha, dx, dn - dx + 1); };
  auto upper = [&](double alpha) { return x == n ? 1.0 : Qbeta(1 - alpha, dx + 1, dn - dx); };
  switch (alternative) {
    case Alternative::kLess: return {0.0, upper(1 - conf)};
    case Alternative::kGreater: return {lower(1 - conf), 1.0};
    case Alternative::kTwoSided: break;
  }
  const double tail = (1.0 - conf) / 2.0;
  return {lower(tail), upper(tail)};
}

Interval Wilson(int64_t x, int64_t n, double conf) {
  const double z = NormalQuantile((1 + conf) / 2);
  const double dn = static_cast<double>(n), p = static_cast<double>(x) / dn;
  const double z22n = z * z / (2 * dn);
  const double centre = p + z22n, denom = 1 + 2 * z22n;
  const double half = z * std::sqrt(p * (1 - p) / dn + z22n / (2 * dn));
  Interval ci;
  ci.low = x == 0 ? 0.0 : std::max(0.0, (centre - half) / denom);
  ci.high = x == n ? 1.0 : std::min(1.0, (centre + half) / denom);
  return ci;
}

double BinomCdf(int64_t k, int64_t n, double p) {
  if (k < 0) return 0.0;
  if (k >= n) return 1.0;
  // P(X <= k) = I_{1-p}(n-k, k+1)
  return Ibetac(static_cast<double>(k + 1), static_cast<double>(n - k), p);
}

double LogBinomTail(int64_t k, int64_t n, double p, bool upper) {
  constexpr double kNegInf = -std::numeric_limits<double>::infinity();
  if (upper) {
    if (k <= 0) return 0.0;
    if (k > n) return kNegInf;
  } else {
    if (k >= n) return 0.0;
    if (k < 0) return kNegInf;
  }
  if (p == 0) return upper ? kNegInf : 0.0;
  if (p == 1) return upper ? 0.0 : kNegInf;
  double direct = upper ? Ibeta(static_cast<double>(k), static_cast<double>(n - k + 1), p)
                        : BinomCdf(k, n, p);
  if (direct > 1e-290) return std::log(direct);
  // The tail underflows, so k is far from the mode and the terms shrink
  // geometrically outwards from k: sum them relative to P(X = k).
  const double q = 1 - p;
  double term = 1, sum = 1;
  if (upper) {
    for (int64_t s = k; s < n; ++s) {
      term *= static_cast<double>(n - s) / static_cast<double>(s + 1) * (p / q);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
  } else {
    for (int64_t s = k; s > 0; --s) {
      term *= static_cast<double>(s) / static_cast<double>(n - s + 1) * (q / p);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
  }
  return LogDbinom(k, n, p) + std::log(sum);
}

BinomTestResult BinomTest(int64_t x, int64_t n, double p0, Alternative alternative, double conf) {
  BinomTestResult r;
  r.estimate = static_cast<double>(x) / static_cast<double>(n);
  r.ci = ClopperPearson(x, n, conf, alternative);
  if (alternative == Alternative::kLess) {
    r.p = PValue::FromLog(LogBinomTail(x, n, p0, false));
    return r;
  }
  if (alternative == Alternative::kGreater) {
    r.p = PValue::FromLog(LogBinomTail(x, n, p0, true));
    return r;
  }
  if (p0 == 0 || p0 == 1) {
    bool at_mass = p0 == 0 ? x == 0 : x == n;
    r.p = PValue::FromValue(at_mass ? 1.0 : 0.0);
    if (!at_mass) r.p.log10_p = -std::numeric_limits<double>::infinity();
    return r;
  }
  const double m = static_cast<double>(n) * p0;
  if (static_cast<double>(x) == m) {
    r.p = PValue::FromValue(1.0);
    return r;
  }
  // R counts the outcomes on the far side of the mean that are no more
  // likely than x; the density is monotone there, so a binary search finds
  // the boundary in O(log n) instead of R's O(n) scan.
  const double threshold = LogDbinom(x, n, p0) + std::log(kRelErr);
  auto no_more_likely = [&](int64_t i) { return LogDbinom(i, n, p0) <= threshold; };
  double log_p;
  if (static_cast<double>(x) < m) {
    int64_t lo = static_cast<int64_t>(std::ceil(m)), hi = n + 1;  // first i in [ceil(m), n] that qualifies
    while (lo < hi) {
      int64_t mid = lo + (hi - lo) / 2;
      if (no_more_likely(mid)) hi = mid;
      else lo = mid + 1;
    }
    log_p = LogAddExp(LogBinomTail(x, n, p0, false), LogBinomTail(lo, n, p0, true));
  } else {
    int64_t lo = -1, hi = static_cast<int64_t>(std::floor(m));  // last i in [0, floor(m)] that qualifies
    while (lo < hi) {
      int64_t mid = lo + (hi - lo + 1) / 2;
      if (no_more_likely(mid)) lo = mid;
      else hi = mid - 1;
    }
    log_p = LogAddExp(LogBinomTail(lo, n, p0, false), LogBinomTail(x, n, p0, true));
  }
  r.p = PValue::FromLog(log_p);
  return r;
}

}  // namespace twinprobe::stats
