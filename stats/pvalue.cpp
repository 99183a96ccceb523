#include "stats/pvalue.h"

#include <algorithm>
#include <limits>

#include <boost/math/distributions/normal.hpp>
#include <boost/math/special_functions/gamma.hpp>

namespace twinprobe::stats {

PValue PValue::FromLog(double log_p) {
  PValue v;
  if (std::isnan(log_p)) return {std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::quiet_NaN()};
  log_p = std::min(log_p, 0.0);
  v.p = std::exp(log_p);
  v.log10_p = log_p / std::log(10.0);
  return v;
}

PValue PValue::FromValue(double p) {
  PValue v;
  v.p = p;
  v.log10_p = std::log10(p);
  return v;
}

double LogAddExp(double x, double y) {
  if (x == -std::numeric_limits<double>::infinity()) return y;
  if (y == -std::numeric_limits<double>::infinity()) return x;
  double hi = std::max(x, y), lo = std::min(x, y);
  return hi + std::log1p(std::exp(lo - hi));
}

PValue ChiSquareUpper(double statistic, double df) {
  if (std::isnan(statistic)) return PValue::FromLog(std::numeric_limits<double>::quiet_NaN());
  if (statistic <= 0) return PValue::FromValue(1.0);
  const double a = df / 2.0, x = statistic / 2.0;
  double q = boost::math::gamma_q(a, x);
  if (q > 1e-300) return PValue::FromValue(q);
  // Far tail: Q(a, x) ~ x^(a-1) e^-x / Gamma(a) * sum_k (a-1)(a-2)...(a-k) / x^k
  // (Abramowitz & Stegun 6.5.32); x > 600 here, so a few terms suffice.
  double term = 1, sum = 1;
  for (int k = 1; k < 60; ++k) {
    term *= (a - k) / x;
    sum += term;
    if (std::abs(term) < 1e-17 * std::abs(sum)) break;
  }
  return PValue::FromLog((a - 1) * std::log(x) - x - std::lgamma(a) + std::log(sum));
}

double NormalQuantile(double q) { return boost::math::quantile(boost::math::normal_distribution<double>(), q); }

}  // namespace twinprobe::stats
