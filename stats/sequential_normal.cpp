#include "stats/sequential_normal.h"

#include <cmath>

#include "stats/power_internal.h"

namespace twinprobe::stats {
namespace {

using internal::NormalCdf;
using internal::NormalQuantile;

constexpr int kIntervals = 600;  // Simpson intervals across the continuation region (even)
const double kInvSqrt2Pi = 0.3989422804014327;

struct Grid {
  std::vector<double> x;        // points on the S scale
  std::vector<double> weighted; // Simpson weight * density
};

Grid MakeGrid(double half_width) {
  Grid g;
  const double h = 2.0 * half_width / kIntervals;
  for (int i = 0; i <= kIntervals; ++i) g.x.push_back(-half_width + h * i);
  g.weighted.assign(g.x.size(), 0.0);
  return g;
}

double SimpsonWeight(int i, double h) {
  if (i == 0 || i == kIntervals) return h / 3.0;
  return (i % 2 ? 4.0 : 2.0) * h / 3.0;
}

// P(cross at the next look with boundary c) from the surviving density.
double CrossingProbability(const Grid& g, double c, double t_next, double step_sd) {
  const double a = c * std::sqrt(t_next);
  double p = 0.0;
  for (size_t i = 0; i < g.x.size(); ++i) {
    if (g.weighted[i] == 0.0) continue;
    p += g.weighted[i] * (NormalCdf((g.x[i] - a) / step_sd) + NormalCdf((-a - g.x[i]) / step_sd));
  }
  return p;
}

}  // namespace

std::vector<double> NormalSpendingBoundaries(const std::vector<double>& information, double alpha,
                                             Spending spending) {
  std::vector<double> c(information.size());
  if (information.empty()) return c;
  // First look: Z_1 is standard normal.
  const double t1 = information[0];
  double spent = AlphaSpent(spending, alpha, t1);
  c[0] = NormalQuantile(1.0 - spent / 2.0);
  Grid g = MakeGrid(c[0] * std::sqrt(t1));
  const double h1 = 2.0 * c[0] * std::sqrt(t1) / kIntervals;
  for (int i = 0; i <= kIntervals; ++i) {
    const double z = g.x[i] / std::sqrt(t1);
    g.weighted[i] = SimpsonWeight(i, h1) * kInvSqrt2Pi * std::exp(-0.5 * z * z) / std::sqrt(t1);
  }
  for (size_t k = 1; k < information.size(); ++k) {
    const double t = information[k];
    const double step_sd = std::sqrt(t - information[k - 1]);
    const double target = AlphaSpent(spending, alpha, t) - spent;
    // Crossing probability falls as c grows: bisect.
    double lo = 0.0, hi = 40.0;
    for (int it = 0; it < 100 && hi - lo > 1e-12; ++it) {
      const double mid = 0.5 * (lo + hi);
      (CrossingProbability(g, mid, t, step_sd) > target ? lo : hi) = mid;
    }
    c[k] = 0.5 * (lo + hi);
    spent += target;
    if (k + 1 == information.size()) break;
    // Carry the surviving density to the new continuation region.
    const double a = c[k] * std::sqrt(t);
    Grid next = MakeGrid(a);
    const double h = 2.0 * a / kIntervals;
    for (int j = 0; j <= kIntervals; ++j) {
      double f = 0.0;
      for (size_t i = 0; i < g.x.size(); ++i) {
        const double u = (next.x[j] - g.x[i]) / step_sd;
        f += g.weighted[i] * std::exp(-0.5 * u * u);
      }
      next.weighted[j] = SimpsonWeight(j, h) * f * kInvSqrt2Pi / step_sd;
    }
    g = std::move(next);
  }
  return c;
}

}  // namespace twinprobe::stats
