#include "stats/power_unpaired.h"

#include <cmath>

#include "stats/power_internal.h"

namespace twinprobe::stats {

using internal::NormalCdf;
using internal::NormalQuantile;

namespace {

// sqrt(n1) times the standard deviation of p1_hat - p2_hat under the
// alternative and (pooled) under the null. With ratio = 1, sd_null =
// sqrt(2 pbar qbar) = sqrt((p1+p2)(1-(p1+p2)/2)) as R writes it.
struct Spread {
  double alt, null;
};
Spread SpreadOf(double p1, double p2, double ratio) {
  const double pbar = (p1 + ratio * p2) / (1 + ratio);
  return {std::sqrt(p1 * (1 - p1) + p2 * (1 - p2) / ratio), std::sqrt(pbar * (1 - pbar) * (1 + 1 / ratio))};
}

}  // namespace

double NormalTwoProportionPower(double n_per_arm, double p1, double p2, double alpha, int sides, bool strict,
                                double ratio) {
  const double z = NormalQuantile(1.0 - alpha / sides);
  const double d = std::fabs(p1 - p2);
  const Spread sd = SpreadOf(p1, p2, ratio);
  const double sd_alt = sd.alt, sd_null = sd.null;
  const double rn = std::sqrt(n_per_arm);
  double power = NormalCdf((rn * d - z * sd_null) / sd_alt);
  if (strict && sides == 2) power += NormalCdf(-(rn * d + z * sd_null) / sd_alt);  // R: lower.tail = FALSE
  return power;
}

double NormalTwoProportionSampleSize(double p1, double p2, double alpha, double power, int sides, bool strict,
                                     double ratio) {
  const double z = NormalQuantile(1.0 - alpha / sides);
  const double zb = NormalQuantile(power);
  const double d = std::fabs(p1 - p2);
  const Spread sd = SpreadOf(p1, p2, ratio);
  const double sd_alt = sd.alt, sd_null = sd.null;
  // Non-strict power = Phi(x) is solved by sqrt(n) d = z sd_null + zb sd_alt.
  const double root = (z * sd_null + zb * sd_alt) / d;
  double n = root * root;
  if (!(strict && sides == 2)) return n;
  // Strict power only adds the far tail, so its n is at most the non-strict
  // one: bisect on [tiny, n] (power increases with n).
  double lo = 1e-9, hi = n;
  for (int i = 0; i < 200 && hi - lo > 1e-12 * hi; ++i) {
    const double mid = 0.5 * (lo + hi);
    (NormalTwoProportionPower(mid, p1, p2, alpha, sides, true, ratio) >= power ? hi : lo) = mid;
  }
  return hi;
}

std::optional<double> NormalTwoProportionDetectable(double n_per_arm, double p1, double alpha, double power,
                                                    bool above, int sides, bool strict, double ratio) {
  // Power grows as p2 moves away from p1 on either side; bisect between p1
  // (power <= alpha) and the far end of the chosen side.
  double near = p1, far = above ? 1.0 : 0.0;
  if (NormalTwoProportionPower(n_per_arm, p1, far, alpha, sides, strict, ratio) < power) return std::nullopt;
  for (int i = 0; i < 200 && std::fabs(far - near) > 1e-13; ++i) {
    const double mid = 0.5 * (near + far);
    (NormalTwoProportionPower(n_per_arm, p1, mid, alpha, sides, strict, ratio) >= power ? far : near) = mid;
  }
  return far;
}

}  // namespace twinprobe::stats
