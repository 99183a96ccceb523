#include "stats/impact.h"

#include <cmath>
#include <cstdint>
#include <limits>

#include <boost/math/tools/roots.hpp>

#include "stats/pvalue.h"

namespace twinprobe::stats {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kInf = std::numeric_limits<double>::infinity();

// The score statistic for H0: p1 / p2 = theta (Koopman 1984), with the
// restricted maximum-likelihood rates from A q^2 + B q + C = 0.
double Score(double theta, double x1, double n1, double x2, double n2) {
  const double a = theta * (n1 + n2), b = -(theta * (n1 + x2) + x1 + n2), c = x1 + x2;
  const double q2 = (-b - std::sqrt(std::max(0.0, b * b - 4 * a * c))) / (2 * a);
  const double q1 = theta * q2;
  const double variance = q1 * (1 - q1) / n1 + theta * theta * q2 * (1 - q2) / n2;
  const double difference = x1 / n1 - theta * x2 / n2;
  // At the estimate the statistic is 0; when both rates are 1 the variance is
  // 0 there too, and 0 / 0 would stop the root search that starts from it.
  if (difference == 0) return 0;
  return difference / std::sqrt(variance);
}

// The theta in (0, inf) where Score = target, searched on log theta from
// `start` in direction `side` (-1 down, +1 up); Score falls as theta rises.
double SolveScore(double target, double start, int side, double x1, double n1, double x2, double n2) {
  auto f = [&](double log_theta) { return Score(std::exp(log_theta), x1, n1, x2, n2) - target; };
  double inner = std::log(start), outer = inner;
  for (double step = 0.25;; step *= 2) {
    outer = inner + side * step;
    if (step > 100) return side < 0 ? 0.0 : kInf;
    if ((side < 0 && f(outer) > 0) || (side > 0 && f(outer) < 0)) break;
  }
  const double lo = std::min(inner, outer), hi = std::max(inner, outer);
  std::uintmax_t iters = 300;
  auto tol = [](double a, double b) { return std::abs(a - b) <= 1e-13; };
  auto r = boost::math::tools::toms748_solve(f, lo, hi, f(lo), f(hi), tol, iters);
  return std::exp((r.first + r.second) / 2);
}

}  // namespace

ImpactRatio ImpactRatioOf(int64_t x1, int64_t n1, int64_t x2, int64_t n2, double conf) {
  ImpactRatio r;
  r.rate = static_cast<double>(x1) / static_cast<double>(n1);
  r.reference_rate = static_cast<double>(x2) / static_cast<double>(n2);
  if (x1 + x2 == 0) {
    r.ratio = kNaN;
    r.katz_log = {kNaN, kNaN};
    r.koopman_score = {kNaN, kNaN};
    return r;
  }
  r.ratio = r.rate / r.reference_rate;
  // In whole numbers (5 x1 n2 < 4 x2 n1), so that exactly 0.8 is not read as below.
  r.below_four_fifths = 5 * static_cast<double>(x1) * static_cast<double>(n2) <
                        4 * static_cast<double>(x2) * static_cast<double>(n1);
  const double z = NormalQuantile(1 - (1 - conf) / 2);
  const double dx1 = static_cast<double>(x1), dn1 = static_cast<double>(n1);
  const double dx2 = static_cast<double>(x2), dn2 = static_cast<double>(n2);
  if (x1 > 0 && x2 > 0) {
    const double se = std::sqrt(1 / dx1 - 1 / dn1 + 1 / dx2 - 1 / dn2);
    r.katz_log = {std::exp(std::log(r.ratio) - z * se), std::exp(std::log(r.ratio) + z * se)};
  } else {
    r.katz_log = {kNaN, kNaN};
  }
  // Search outwards from a point inside the interval: the estimate, or with
  // a zero count a ratio near the open end (the score statistic is near 0
  // there, inside -+z).
  const double inside = x1 == 0 ? 1e-9 / r.reference_rate : x2 == 0 ? 1e9 * r.rate : r.ratio;
  r.koopman_score.low = x1 == 0 ? 0.0 : SolveScore(z, inside, -1, dx1, dn1, dx2, dn2);
  r.koopman_score.high = x2 == 0 ? kInf : SolveScore(-z, inside, +1, dx1, dn1, dx2, dn2);
  return r;
}

std::vector<ImpactRatio> ImpactRatios(const std::vector<int64_t>& positives, const std::vector<int64_t>& totals,
                                      int reference, double conf) {
  size_t ref = 0;
  if (reference == kHighestRate) {
    // Compare x_i / n_i in whole numbers: x_i n_ref > x_ref n_i.
    for (size_t i = 1; i < totals.size(); ++i)
      if (static_cast<double>(positives[i]) * static_cast<double>(totals[ref]) >
          static_cast<double>(positives[ref]) * static_cast<double>(totals[i]))
        ref = i;
  } else {
    ref = static_cast<size_t>(reference);
  }
  std::vector<ImpactRatio> out;
  for (size_t i = 0; i < totals.size(); ++i)
    out.push_back(ImpactRatioOf(positives[i], totals[i], positives[ref], totals[ref], conf));
  return out;
}

}  // namespace twinprobe::stats
