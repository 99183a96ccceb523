#include "stats/paired_midp.h"

#include <cmath>
#include <limits>

#include <boost/math/special_functions/beta.hpp>

#include "stats/log_density.h"

namespace twinprobe::stats {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// P(X > x) + P(X = x)/2 (upper) or P(X < x) + P(X = x)/2 (lower) at p.
// The strict tails come from the incomplete beta so they keep their digits
// when small: P(X >= x+1) = I_p(x+1, n-x), P(X <= x-1) = I_{1-p}(n-x+1, x).
double MidTail(int64_t x, int64_t n, double p, bool upper) {
  const double dx = static_cast<double>(x), dn = static_cast<double>(n);
  const double half = 0.5 * std::exp(LogDbinom(x, n, p));
  if (upper) return (x == n ? 0.0 : boost::math::ibeta(dx + 1, dn - dx, p)) + half;
  return (x == 0 ? 0.0 : boost::math::ibetac(dx, dn - dx + 1, p)) + half;
}

// The p in (0, 1) where MidTail(x, n, p, upper) = alpha. The upper mid-tail
// rises with p and the lower one falls, so bisection on the logit of p
// brackets the root; 200 halvings of [-60, 60] reach the limit of a double.
double SolveMidP(int64_t x, int64_t n, double alpha, bool upper) {
  double lo = -60, hi = 60;
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (lo + hi);
    const double p = 1 / (1 + std::exp(-mid));
    const double f = MidTail(x, n, p, upper) - alpha;
    if ((f < 0) == upper) lo = mid;
    else hi = mid;
    if (hi - lo < 1e-15 * std::max(1.0, std::fabs(mid))) break;
  }
  return 1 / (1 + std::exp(-0.5 * (lo + hi)));
}

double Odds(double p) { return p >= 1 ? kInf : p / (1 - p); }

}  // namespace

Interval MidPBinomialInterval(int64_t x, int64_t n, double conf, Alternative alternative) {
  const double alpha = alternative == Alternative::kTwoSided ? (1 - conf) / 2 : 1 - conf;
  auto lower = [&] { return x == 0 ? 0.0 : SolveMidP(x, n, alpha, true); };
  auto upper = [&] { return x == n ? 1.0 : SolveMidP(x, n, alpha, false); };
  switch (alternative) {
    case Alternative::kLess: return {0.0, upper()};
    case Alternative::kGreater: return {lower(), 1.0};
    case Alternative::kTwoSided: break;
  }
  return {lower(), upper()};
}

Estimate ConditionalOddsRatioMidP(const DiscordantCounts& t, double conf, Alternative alternative) {
  const int64_t n = t.discordant();
  if (n == 0) return {kNaN, {kNaN, kNaN}};
  Estimate e;
  e.estimate = t.c == 0 ? kInf : static_cast<double>(t.b) / static_cast<double>(t.c);
  const Interval p = MidPBinomialInterval(t.b, n, conf, alternative);
  e.ci = {Odds(p.low), Odds(p.high)};
  return e;
}

}  // namespace twinprobe::stats
