#include "stats/paired.h"

#include <cmath>
#include <limits>

namespace twinprobe::stats {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kInf = std::numeric_limits<double>::infinity();

double Odds(double p) { return p >= 1 ? kInf : p / (1 - p); }

}  // namespace

Estimate ConditionalOddsRatio(const PairedCounts& t, double conf) {
  Estimate e;
  const int64_t n = t.discordant();
  if (n == 0) return {kNaN, {kNaN, kNaN}};
  e.estimate = t.c == 0 ? kInf : static_cast<double>(t.b) / static_cast<double>(t.c);
  Interval p = ClopperPearson(t.b, n, conf);
  e.ci = {Odds(p.low), Odds(p.high)};
  return e;
}

Estimate NewcombePairedDifference(const PairedCounts& t, double conf) {
  const int64_t n = t.n();
  if (n == 0) return {kNaN, {kNaN, kNaN}};
  const double dn = static_cast<double>(n);
  const double p1 = static_cast<double>(t.a + t.b) / dn, p2 = static_cast<double>(t.a + t.c) / dn;
  const Interval w1 = Wilson(t.a + t.b, n, conf), w2 = Wilson(t.a + t.c, n, conf);
  const double product = static_cast<double>(t.a + t.b) * static_cast<double>(t.c + t.d) *
                         static_cast<double>(t.a + t.c) * static_cast<double>(t.b + t.d);
  double phi = 0;
  if (product > 0) {
    double ad_bc = static_cast<double>(t.a) * static_cast<double>(t.d) - static_cast<double>(t.b) * static_cast<double>(t.c);
    double corrected = ad_bc <= 0 ? ad_bc : std::max(ad_bc - dn / 2, 0.0);
    phi = corrected / std::sqrt(product);
  }
  const double d = p1 - p2;
  const double dl1 = p1 - w1.low, du1 = w1.high - p1, dl2 = p2 - w2.low, du2 = w2.high - p2;
  Estimate e;
  e.estimate = d;
  e.ci.low = d - std::sqrt(std::max(0.0, dl1 * dl1 - 2 * phi * dl1 * du2 + du2 * du2));
  e.ci.high = d + std::sqrt(std::max(0.0, dl2 * dl2 - 2 * phi * dl2 * du1 + du1 * du1));
  return e;
}

NetDiscrimination NetDiscriminationRates(const PairedCounts& t, double conf) {
  NetDiscrimination r;
  r.among_positive = NewcombePairedDifference(PairedCounts{t.a, t.b, t.c, 0}, conf);
  r.over_all = NewcombePairedDifference(t, conf);
  return r;
}

}  // namespace twinprobe::stats
