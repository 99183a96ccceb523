#include "stats/log_density.h"

#include <cmath>
#include <limits>

namespace twinprobe::stats {
namespace {

constexpr double kLn2Pi = 1.837877066409345483560659472811;  // log(2 pi)
constexpr double kNegInf = -std::numeric_limits<double>::infinity();

// Stirling's error: log(n!) - (n + 1/2) log(n) + n - log(sqrt(2 pi)). For
// small n lgamma is exact enough (its absolute error ~1e-16 on values < 30);
// for n > 15 the asymptotic series 1/12n - 1/360n^3 + ... (Loader 2000,
// section 2) converges to machine precision.
double StirlingError(double n) {
  constexpr double s0 = 1.0 / 12, s1 = 1.0 / 360, s2 = 1.0 / 1260, s3 = 1.0 / 1680, s4 = 1.0 / 1188;
  if (n <= 15.0) return std::lgamma(n + 1.0) - (n + 0.5) * std::log(n) + n - 0.5 * kLn2Pi;
  const double nn = n * n;
  if (n > 500) return (s0 - s1 / nn) / n;
  if (n > 80) return (s0 - (s1 - s2 / nn) / nn) / n;
  if (n > 35) return (s0 - (s1 - (s2 - s3 / nn) / nn) / nn) / n;
  return (s0 - (s1 - (s2 - (s3 - s4 / nn) / nn) / nn) / nn) / n;
}

// Deviance term x log(x / np) + np - x; near x = np a series in
// v = (x - np) / (x + np) avoids the cancellation (Loader 2000, section 3).
double Bd0(double x, double np) {
  if (std::abs(x - np) < 0.1 * (x + np)) {
    double v = (x - np) / (x + np);
    double s = (x - np) * v;
    double ej = 2 * x * v;
    v = v * v;
    for (int j = 1; j < 1000; ++j) {
      ej *= v;
      double s1 = s + ej / (2 * j + 1);
      if (s1 == s) return s1;
      s = s1;
    }
    return s;
  }
  return x * std::log(x / np) + np - x;
}

// log of the binomial density with success probability p and q = 1 - p
// given separately (so q keeps its precision when p is close to 1).
double LogDbinomRaw(double x, double n, double p, double q) {
  if (p == 0) return x == 0 ? 0.0 : kNegInf;
  if (q == 0) return x == n ? 0.0 : kNegInf;
  if (x == 0) {
    if (n == 0) return 0.0;
    return p < 0.1 ? -Bd0(n, n * q) - n * p : n * std::log(q);
  }
  if (x == n) return q < 0.1 ? -Bd0(n, n * p) - n * q : n * std::log(p);
  if (x < 0 || x > n) return kNegInf;
  double lc = StirlingError(n) - StirlingError(x) - StirlingError(n - x) - Bd0(x, n * p) - Bd0(n - x, n * q);
  double lf = kLn2Pi + std::log(x) + std::log1p(-x / n);
  return lc - 0.5 * lf;
}

}  // namespace

double LogDbinom(int64_t x, int64_t n, double p) {
  if (x < 0 || x > n) return kNegInf;
  return LogDbinomRaw(static_cast<double>(x), static_cast<double>(n), p, 1.0 - p);
}

double LogDhyper(int64_t x, int64_t m, int64_t n, int64_t k) {
  if (x < 0 || x > m || k - x < 0 || k - x > n) return kNegInf;
  if (k == 0 || k == m + n) return 0.0;
  // dhyper = dbinom(x; m, p) dbinom(k - x; n, p) / dbinom(k; m + n, p) for
  // any p; p = k / (m + n) keeps every factor near its mode.
  const double total = static_cast<double>(m + n);
  const double p = static_cast<double>(k) / total, q = static_cast<double>(m + n - k) / total;
  return LogDbinomRaw(static_cast<double>(x), static_cast<double>(m), p, q) +
         LogDbinomRaw(static_cast<double>(k - x), static_cast<double>(n), p, q) -
         LogDbinomRaw(static_cast<double>(k), total, p, q);
}

}  // namespace twinprobe::stats
