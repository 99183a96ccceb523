#include "stats/wasserstein.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace twinprobe::stats {
namespace {

std::string CheckOne(const char* name, const std::vector<double>& values, const std::vector<double>& weights) {
  const std::string n(name);
  if (values.empty()) return "the sample " + n + " is empty";
  for (double x : values)
    if (!std::isfinite(x)) return "the sample " + n + " holds a value that is not a finite number";
  if (weights.empty()) return "";
  if (weights.size() != values.size())
    return "the sample " + n + " has " + std::to_string(values.size()) + " values but " +
           std::to_string(weights.size()) + " weights";
  double total = 0;
  for (double w : weights) {
    if (!std::isfinite(w) || w < 0) return "the weights of " + n + " must be finite and non-negative";
    total += w;
  }
  if (!(total > 0) || !std::isfinite(total)) return "the weights of " + n + " must have a positive, finite sum";
  return "";
}

// Cumulative weight function of one sample at sorted order: returns the
// values sorted and the running share of total weight after each of them.
void SortedCdf(const std::vector<double>& values, const std::vector<double>& weights, std::vector<double>& sorted,
               std::vector<double>& cum_share) {
  std::vector<size_t> order(values.size());
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(), [&](size_t a, size_t b) { return values[a] < values[b]; });
  sorted.resize(values.size());
  cum_share.resize(values.size());
  double total = 0;
  if (!weights.empty())
    for (double w : weights) total += w;
  double running = 0;
  for (size_t i = 0; i < order.size(); ++i) {
    sorted[i] = values[order[i]];
    if (weights.empty()) {
      cum_share[i] = static_cast<double>(i + 1) / static_cast<double>(values.size());
    } else {
      running += weights[order[i]];
      cum_share[i] = running / total;
    }
  }
}

}  // namespace

std::string CheckWassersteinInput(const std::vector<double>& u, const std::vector<double>& v,
                                  const std::vector<double>& u_weights, const std::vector<double>& v_weights) {
  std::string e = CheckOne("u", u, u_weights);
  if (!e.empty()) return e;
  return CheckOne("v", v, v_weights);
}

double Wasserstein1(const std::vector<double>& u, const std::vector<double>& v, const std::vector<double>& u_weights,
                    const std::vector<double>& v_weights) {
  std::vector<double> us, uc, vs, vc;
  SortedCdf(u, u_weights, us, uc);
  SortedCdf(v, v_weights, vs, vc);
  // Walk the merged support left to right; between two consecutive support
  // points both CDFs are constant, so the integral is a sum of rectangles.
  // The CDF at a point counts every value <= it (scipy's searchsorted
  // 'right'), which is what advancing past equal values does here.
  size_t i = 0, j = 0;
  double fu = 0, fv = 0, total = 0;
  double x = std::min(us.front(), vs.front());
  while (i < us.size() || j < vs.size()) {
    double next_u = i < us.size() ? us[i] : HUGE_VAL;
    double next_v = j < vs.size() ? vs[j] : HUGE_VAL;
    double next = std::min(next_u, next_v);
    total += std::fabs(fu - fv) * (next - x);
    x = next;
    while (i < us.size() && us[i] == x) fu = uc[i++];
    while (j < vs.size() && vs[j] == x) fv = vc[j++];
  }
  return total;
}

double Wasserstein1OnGrid(const std::vector<double>& u_counts, const std::vector<double>& v_counts, double spacing) {
  double tu = 0, tv = 0;
  for (double c : u_counts) tu += c;
  for (double c : v_counts) tv += c;
  double fu = 0, fv = 0, total = 0;
  // The last grid point has F_u = F_v = 1, so it adds nothing.
  for (size_t k = 0; k + 1 < u_counts.size(); ++k) {
    fu += u_counts[k];
    fv += v_counts[k];
    total += std::fabs(fu / tu - fv / tv);
  }
  return total * spacing;
}

double Wasserstein1Split(const std::vector<double>& sorted_values, const std::vector<uint8_t>& in_u) {
  double nu = 0, nv = 0;
  for (uint8_t b : in_u) (b ? nu : nv) += 1;
  double cu = 0, cv = 0, total = 0;
  const size_t n = sorted_values.size();
  for (size_t k = 0; k + 1 < n; ++k) {
    (in_u[k] ? cu : cv) += 1;
    double gap = sorted_values[k + 1] - sorted_values[k];
    if (gap != 0) total += std::fabs(cu / nu - cv / nv) * gap;
  }
  return total;
}

}  // namespace twinprobe::stats
