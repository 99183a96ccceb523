#include "stats/power_internal.h"

#include <cmath>

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/normal.hpp>

namespace twinprobe::stats::internal {

void FillBinomialWeights(int64_t n, double p, double tail_mass, BinomialWeights& out) {
  out.weights.clear();
  if (n == 0 || p <= 0.0) {
    out.lo = 0;
    out.weights.push_back(1.0);
    return;
  }
  if (p >= 1.0) {
    out.lo = n;
    out.weights.push_back(1.0);
    return;
  }
  const double nd = static_cast<double>(n);
  int64_t mode = static_cast<int64_t>(std::floor((nd + 1.0) * p));
  if (mode > n) mode = n;
  const double log_odds = std::log(p) - std::log1p(-p);
  // The mode's probability from Boost's binomial pdf (through the incomplete
  // beta derivative): lgamma(n + 1) - lgamma(k + 1) - … loses about
  // 1e-16 * lgamma(n) relative accuracy, 1e-12 at n = 10,000.
  const double log_mode = std::log(boost::math::pdf(
      boost::math::binomial_distribution<double, FastPolicy>(nd, p), static_cast<double>(mode)));

  // Upwards from the mode: log w(k+1) = log w(k) + log((n-k)/(k+1)) + log_odds.
  std::vector<double> up;
  double lw = log_mode;
  for (int64_t k = mode; k < n; ++k) {
    const double ratio_log = std::log(static_cast<double>(n - k)) - std::log(static_cast<double>(k + 1)) + log_odds;
    const double r = std::exp(ratio_log);
    const double w = std::exp(lw);
    if (r < 1.0 && w * r / (1.0 - r) < tail_mass) break;
    lw += ratio_log;
    up.push_back(std::exp(lw));
  }
  // Downwards: log w(k-1) = log w(k) + log(k/(n-k+1)) - log_odds.
  std::vector<double> down;
  lw = log_mode;
  for (int64_t k = mode; k > 0; --k) {
    const double ratio_log = std::log(static_cast<double>(k)) - std::log(static_cast<double>(n - k + 1)) - log_odds;
    const double r = std::exp(ratio_log);
    const double w = std::exp(lw);
    if (r < 1.0 && w * r / (1.0 - r) < tail_mass) break;
    lw += ratio_log;
    down.push_back(std::exp(lw));
  }
  out.lo = mode - static_cast<int64_t>(down.size());
  out.weights.reserve(down.size() + 1 + up.size());
  for (auto it = down.rbegin(); it != down.rend(); ++it) out.weights.push_back(*it);
  out.weights.push_back(std::exp(log_mode));
  for (double w : up) out.weights.push_back(w);
}

double NormalQuantile(double p) { return boost::math::quantile(boost::math::normal_distribution<double>(), p); }

double NormalCdf(double z) { return 0.5 * std::erfc(-z / std::sqrt(2.0)); }

}  // namespace twinprobe::stats::internal
