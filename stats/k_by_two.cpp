#include "stats/k_by_two.h"

#include <algorithm>
#include <cmath>

#include "stats/pvalue.h"

namespace twinprobe::stats {
namespace {

double LogChoose(int64_t n, int64_t k) {
  return std::lgamma(static_cast<double>(n) + 1) - std::lgamma(static_cast<double>(k) + 1) -
         std::lgamma(static_cast<double>(n - k) + 1);
}

// Walks every table row by row; rows after `i` can absorb at most
// capacity[i] positives.
struct Enumerator {
  const std::vector<int64_t>& n;
  std::vector<int64_t> capacity;  // sum of n_j for j >= i
  std::vector<std::vector<double>> log_c;
  double log_threshold = 0;  // log of (observed probability * (1 + 1e-7)), unnormalised
  double sum = 0;            // of exp(log p - log_scale) over tables at or below the threshold
  double log_scale = 0;

  void Walk(size_t i, int64_t left, double log_p) {
    if (i + 1 == n.size()) {
      const double lp = log_p + log_c[i][static_cast<size_t>(left)];
      if (lp <= log_threshold) sum += std::exp(lp - log_scale);
      return;
    }
    const int64_t lo = std::max<int64_t>(0, left - capacity[i + 1]);
    const int64_t hi = std::min(left, n[i]);
    for (int64_t x = lo; x <= hi; ++x) Walk(i + 1, left - x, log_p + log_c[i][static_cast<size_t>(x)]);
  }
};

// An upper bound on the number of tables with these margins: every row but
// the last takes one of at most min(n_i, s) + 1 values (the last is then
// fixed). Cheap whatever the counts, unlike counting the tables exactly.
double TablesBound(const std::vector<int64_t>& n, int64_t s) {
  double bound = 1;
  for (size_t i = 0; i + 1 < n.size(); ++i) bound *= static_cast<double>(std::min(n[i], s) + 1);
  return bound;
}

}  // namespace

KByTwoTest KByTwo(const std::vector<int64_t>& positives, const std::vector<int64_t>& probes) {
  KByTwoTest t;
  const size_t k = probes.size();
  int64_t total = 0, s = 0;
  for (size_t i = 0; i < k; ++i) total += probes[i], s += positives[i];
  t.df = static_cast<int>(k) - 1;
  const double p = static_cast<double>(s) / static_cast<double>(total);
  t.min_expected = HUGE_VAL;
  for (size_t i = 0; i < k; ++i) {
    const double e1 = static_cast<double>(probes[i]) * p, e0 = static_cast<double>(probes[i]) * (1 - p);
    t.min_expected = std::min({t.min_expected, e1, e0});
    if (e1 > 0) t.chi2 += std::pow(static_cast<double>(positives[i]) - e1, 2) / e1;
    if (e0 > 0) t.chi2 += std::pow(static_cast<double>(probes[i] - positives[i]) - e0, 2) / e0;
  }
  // With no positive or no negative at all the table has one column: no test.
  if (s == 0 || s == total) {
    t.chi2 = 0;
    t.p_exact = 1.0;
    t.tables = 1;
    return t;
  }
  t.p_chi2 = ChiSquareUpper(t.chi2, t.df).p;
  t.tables = TablesBound(probes, s);
  if (t.tables > kMaxKByTwoTables) return t;
  Enumerator e{probes, std::vector<int64_t>(k + 1, 0), {}, 0, 0, 0};
  for (size_t i = k; i-- > 0;) e.capacity[i] = e.capacity[i + 1] + probes[i];
  double log_observed = 0;
  for (size_t i = 0; i < k; ++i) {
    std::vector<double> row;
    for (int64_t x = 0; x <= probes[i]; ++x) row.push_back(LogChoose(probes[i], x));
    log_observed += row[static_cast<size_t>(positives[i])];
    e.log_c.push_back(std::move(row));
  }
  e.log_threshold = log_observed + std::log1p(1e-7);
  e.log_scale = LogChoose(total, s);
  e.Walk(0, s, 0.0);
  t.p_exact = std::min(1.0, e.sum);
  return t;
}

}  // namespace twinprobe::stats
