#include "stats/equivalence.h"

#include <cmath>
#include <limits>

namespace twinprobe::stats {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Phi(z) and 1 - Phi(z) with their digits kept in the far tails.
double NormalLower(double z) { return 0.5 * std::erfc(-z / std::sqrt(2.0)); }
double NormalUpper(double z) { return 0.5 * std::erfc(z / std::sqrt(2.0)); }

// The delta0 in (-1, 1) where T(delta0) = target. T is decreasing, so
// bisection brackets the root; 200 halvings reach the limit of a double.
double SolveScore(const PairedCounts& t, double target) {
  double lo = -1, hi = 1;
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (lo + hi);
    if (mid <= lo || mid >= hi) break;
    if (TangoScore(t, mid) > target) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

}  // namespace

double TangoScore(const PairedCounts& t, double delta0) {
  const double n = static_cast<double>(t.n()), b = static_cast<double>(t.b), c = static_cast<double>(t.c);
  const double numerator = b - c - n * delta0;
  if (numerator == 0) return 0;
  const double big_b = -b - c + (2 * n - b + c) * delta0;
  const double big_c = -c * delta0 * (1 - delta0);
  const double q = (std::sqrt(big_b * big_b - 8 * n * big_c) - big_b) / (4 * n);
  return numerator / std::sqrt(n * (2 * q + delta0 * (1 - delta0)));
}

Estimate TangoInterval(const PairedCounts& t, double conf) {
  const int64_t n = t.n();
  if (n == 0) return {kNaN, {kNaN, kNaN}};
  const double z = NormalQuantile(1 - (1 - conf) / 2);
  Estimate e;
  e.estimate = static_cast<double>(t.b - t.c) / static_cast<double>(n);
  e.ci.low = t.b - t.c == -n ? -1.0 : SolveScore(t, z);
  e.ci.high = t.b - t.c == n ? 1.0 : SolveScore(t, -z);
  return e;
}

EquivalenceResult PairedEquivalence(const PairedCounts& t, double lower_margin, double upper_margin, double alpha) {
  EquivalenceResult r;
  r.estimate = static_cast<double>(t.b - t.c) / static_cast<double>(t.n());
  r.lower_margin = lower_margin;
  r.upper_margin = upper_margin;
  r.alpha = alpha;
  r.z_lower = TangoScore(t, lower_margin);
  r.z_upper = TangoScore(t, upper_margin);
  r.p_lower = PValue::FromValue(NormalUpper(r.z_lower));
  r.p_upper = PValue::FromValue(NormalLower(r.z_upper));
  r.p = r.p_lower.p >= r.p_upper.p ? r.p_lower : r.p_upper;
  r.ci = TangoInterval(t, 1 - 2 * alpha).ci;
  r.equivalent = r.p.p < alpha;
  return r;
}

}  // namespace twinprobe::stats
