#include "stats/conditional_or.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>

#include "stats/log_density.h"
#include "stats/pvalue.h"

namespace twinprobe::stats {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
// Terms below this fraction of the mode's weight do not change a double sum.
constexpr double kNegligible = 1e-20;
// log psi is searched within +-kMaxLogPsi (psi from 1e-304 to 1e304).
constexpr double kMaxLogPsi = 700;

// Running sums of weights w(s) centred at the mode, for the moments and the
// tails at x.
struct Sums {
  double s0 = 0, s1 = 0, s2 = 0, l0 = 0, l1 = 0, u0 = 0, u1 = 0;
  void Add(int64_t s, int64_t centre, int64_t x, double w) {
    const double dev = static_cast<double>(s - centre);
    s0 += w;
    s1 += w * dev;
    s2 += w * dev * dev;
    if (s <= x) l0 += w, l1 += w * dev;
    if (s >= x) u0 += w, u1 += w * dev;
  }
  FamilyAt Finish(int64_t centre) const {
    FamilyAt f;
    const double mean_dev = s1 / s0;
    f.mean = static_cast<double>(centre) + mean_dev;
    f.var = std::max(0.0, s2 / s0 - mean_dev * mean_dev);
    f.lower = l0 / s0;
    f.upper = u0 / s0;
    // d/dt E[1{S in A}] = Cov(S, 1{S in A}) = E[S 1{S in A}] - E[S] P(A).
    f.dlower = l1 / s0 - mean_dev * f.lower;
    f.dupper = u1 / s0 - mean_dev * f.upper;
    return f;
  }
};

// Finds t with f(t) = 0 for f monotone in t (increasing when `increasing`),
// by Newton steps kept inside a bracket (bisection when a step leaves it).
double SolveMonotone(const std::function<std::pair<double, double>(double)>& f_and_slope, bool increasing,
                     double start) {
  // Newton steps from `start`; the bracket [a, b] tightens with every
  // evaluation, and a step that leaves it becomes a bisection (or, before
  // both ends are known, a bounded step towards the root).
  const double sign = increasing ? 1.0 : -1.0;
  double a = -kMaxLogPsi, b = kMaxLogPsi;
  bool have_a = false, have_b = false;
  double t = std::clamp(start, -kMaxLogPsi, kMaxLogPsi);
  for (int iter = 0; iter < 300; ++iter) {
    auto [f, slope] = f_and_slope(t);
    f *= sign, slope *= sign;
    if (f == 0) return t;
    if (f < 0) a = t, have_a = true;
    else b = t, have_b = true;
    if ((t >= kMaxLogPsi && f < 0) || (t <= -kMaxLogPsi && f > 0)) return t;  // no root inside the range
    double next = slope > 0 && std::isfinite(slope) ? t - f / slope : kNaN;
    if (!(next > a && next < b)) {
      if (have_a && have_b) next = 0.5 * (a + b);
      else next = std::clamp(f < 0 ? t + 4 : t - 4, -kMaxLogPsi, kMaxLogPsi);
    }
    // 1e-13 in log psi is 1e-13 relative in psi: far inside the 1e-9 target,
    // and above the rounding noise of the tail sums (so no endless dithering).
    const double tol = 1e-13 * std::max(1.0, std::abs(t));
    if (std::abs(next - t) <= tol || (have_a && have_b && b - a <= tol)) return next;
    t = next;
  }
  return t;
}

}  // namespace

HypergeometricFamily::HypergeometricFamily(int64_t m, int64_t n, int64_t k)
    : m_(m), n_(n), k_(k), lo_(std::max<int64_t>(0, k - n)), hi_(std::min(k, m)) {}

double HypergeometricFamily::Ratio(int64_t s) const {
  return (static_cast<double>(m_ - s) * static_cast<double>(k_ - s)) /
         (static_cast<double>(s + 1) * static_cast<double>(n_ - k_ + s + 1));
}

int64_t HypergeometricFamily::Mode(double log_psi) const {
  // The tilted ratio psi r(s) decreases in s; the mode is the first s whose
  // ratio to the next term is below 1.
  int64_t a = lo_, b = hi_;
  while (a < b) {
    int64_t mid = a + (b - a) / 2;
    if (log_psi + std::log(Ratio(mid)) < 0) b = mid;
    else a = mid + 1;
  }
  return a;
}

FamilyAt HypergeometricFamily::At(double log_psi, int64_t x) const {
  const int64_t mode = Mode(log_psi);
  const double psi = std::exp(log_psi);
  Sums sums;
  sums.Add(mode, mode, x, 1.0);
  // Every factor is <= 1 walking away from the mode, so nothing overflows.
  double w = 1;
  for (int64_t s = mode; s < hi_; ++s) {
    w *= psi * Ratio(s);
    if (w < kNegligible) break;
    sums.Add(s + 1, mode, x, w);
  }
  w = 1;
  for (int64_t s = mode - 1; s >= lo_; --s) {
    w /= psi * Ratio(s);
    if (w < kNegligible) break;
    sums.Add(s, mode, x, w);
  }
  return sums.Finish(mode);
}

double HypergeometricFamily::LogDensity(int64_t x) const { return LogDhyper(x, m_, n_, k_); }

double HypergeometricFamily::LogTail(int64_t x, bool upper) const {
  if (upper ? x <= lo_ : x >= hi_) return 0.0;
  if (upper ? x > hi_ : x < lo_) return -kInf;
  const int64_t mode = Mode(0);
  // Sum from x away from the mode (terms shrink); a tail that contains the
  // mode is one minus the opposite tail instead.
  const bool contains_mode = upper ? x <= mode : x >= mode;
  if (contains_mode) {
    double other = LogTail(upper ? x - 1 : x + 1, !upper);
    return std::log1p(-std::exp(other));
  }
  double term = 1, sum = 1;
  if (upper) {
    for (int64_t s = x; s < hi_; ++s) {
      term *= Ratio(s);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
  } else {
    for (int64_t s = x - 1; s >= lo_; --s) {
      term /= Ratio(s);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
  }
  return LogDensity(x) + std::log(sum);
}

TabulatedFamily::TabulatedFamily(int64_t lo, std::vector<double> log_weights) : lo_(lo), logw_(std::move(log_weights)) {}

FamilyAt TabulatedFamily::At(double log_psi, int64_t x) const {
  double top = -kInf;
  int64_t centre = lo_;
  for (size_t i = 0; i < logw_.size(); ++i) {
    double v = logw_[i] + log_psi * static_cast<double>(lo_ + static_cast<int64_t>(i));
    if (v > top) top = v, centre = lo_ + static_cast<int64_t>(i);
  }
  Sums sums;
  for (size_t i = 0; i < logw_.size(); ++i) {
    const int64_t s = lo_ + static_cast<int64_t>(i);
    double v = logw_[i] + log_psi * static_cast<double>(s) - top;
    if (v < -745) continue;
    sums.Add(s, centre, x, std::exp(v));
  }
  return sums.Finish(centre);
}

ConditionalEstimate SolveConditional(const ConditionalFamily& family, int64_t x, Alternative alternative,
                                     double conf) {
  const int64_t lo = family.lo(), hi = family.hi();
  if (lo == hi) return {kNaN, {0, kInf}};
  ConditionalEstimate r;
  const double xd = static_cast<double>(x);
  // Start where a normal approximation puts the root: the log odds of x's
  // position in the support (Haldane's +1/2 keeps it finite).
  const double start = std::log((xd - static_cast<double>(lo) + 0.5) / (static_cast<double>(hi) - xd + 0.5));
  double t_mle = kNaN;
  auto mle = [&]() -> double {
    if (x == lo) return 0;
    if (x == hi) return kInf;
    t_mle = SolveMonotone([&](double lt) {
      FamilyAt f = family.At(lt, x);
      return std::make_pair(f.mean - xd, f.var);
    }, true, start);
    return std::exp(t_mle);
  };
  // Upper limit: P(S <= x; psi) = alpha, decreasing in psi; solved on the
  // log scale of the tail, which is closer to linear in log psi.
  // The limits start one normal-approximation step from the MLE.
  auto step = [&](double alpha) {
    if (!std::isfinite(t_mle)) return 0.0;
    FamilyAt f = family.At(t_mle, x);
    return f.var > 0 ? NormalQuantile(1 - alpha) / std::sqrt(f.var) : 0.0;
  };
  auto upper_limit = [&](double alpha) -> double {
    if (x == hi) return kInf;
    double t = SolveMonotone([&](double lt) {
      FamilyAt f = family.At(lt, x);
      return std::make_pair(std::log(f.lower) - std::log(alpha), f.dlower / f.lower);
    }, false, std::isfinite(t_mle) ? t_mle + step(alpha) : start);
    return std::exp(t);
  };
  auto lower_limit = [&](double alpha) -> double {
    if (x == lo) return 0;
    double t = SolveMonotone([&](double lt) {
      FamilyAt f = family.At(lt, x);
      return std::make_pair(std::log(f.upper) - std::log(alpha), f.dupper / f.upper);
    }, true, std::isfinite(t_mle) ? t_mle - step(alpha) : start);
    return std::exp(t);
  };
  r.estimate = mle();
  switch (alternative) {
    case Alternative::kLess: r.ci = {0, upper_limit(1 - conf)}; break;
    case Alternative::kGreater: r.ci = {lower_limit(1 - conf), kInf}; break;
    case Alternative::kTwoSided: {
      double alpha = (1 - conf) / 2;
      r.ci = {lower_limit(alpha), upper_limit(alpha)};
      break;
    }
  }
  return r;
}

}  // namespace twinprobe::stats
