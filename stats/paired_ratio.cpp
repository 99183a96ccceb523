#include "stats/paired_ratio.h"

#include <cmath>
#include <limits>

namespace twinprobe::stats {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Wilson's score limits for x of n at a given z (not a confidence level:
// Bonett & Price shrink z by A / (B + C) before using it).
Interval WilsonAtZ(double x, double n, double z) {
  const double z2 = z * z;
  const double root = z * std::sqrt(z2 + 4 * x * (1 - x / n));
  return {(2 * x + z2 - root) / (2 * (n + z2)), (2 * x + z2 + root) / (2 * (n + z2))};
}

}  // namespace

Estimate CallbackRatio(const PairedCounts& t, double conf, Alternative alternative) {
  const double n1 = static_cast<double>(t.a + t.b), n2 = static_cast<double>(t.a + t.c);
  const double n_star = static_cast<double>(t.a + t.b + t.c);
  Estimate e;
  if (n_star == 0) return {kNaN, {0, kInf}};
  e.estimate = n2 == 0 ? kInf : n1 / n2;
  const double z = NormalQuantile(alternative == Alternative::kTwoSided ? 1 - (1 - conf) / 2 : conf);
  // The pseudo-counts (+1, +2) are Bonett & Price's; they keep A, B and C
  // finite when a cell is 0.
  const double a_term = std::sqrt((static_cast<double>(t.b + t.c) + 2) / ((n1 + 1) * (n2 + 1)));
  const double b_term = std::sqrt((1 - (n1 + 1) / (n_star + 2)) / (n1 + 1));
  const double c_term = std::sqrt((1 - (n2 + 1) / (n_star + 2)) / (n2 + 1));
  const double z_adj = z * a_term / (b_term + c_term);
  const Interval w1 = WilsonAtZ(n1, n_star, z_adj), w2 = WilsonAtZ(n2, n_star, z_adj);
  const double low = w1.low / w2.high;
  const double high = w2.low <= 0 ? kInf : w1.high / w2.low;
  switch (alternative) {
    case Alternative::kLess: e.ci = {0, high}; break;
    case Alternative::kGreater: e.ci = {low, kInf}; break;
    case Alternative::kTwoSided: e.ci = {low, high}; break;
  }
  return e;
}

}  // namespace twinprobe::stats
