#include "stats/contingency.h"

#include <boost/math/distributions/chi_squared.hpp>

#include <algorithm>
#include <cfloat>
#include <cmath>

namespace twinprobe::stats {
namespace {

// The table without rows and columns whose total is zero.
CountTable Compact(const CountTable& t) {
  if (t.empty()) return {};
  const size_t cols = t.front().size();
  std::vector<bool> keep_col(cols, false);
  for (const auto& row : t)
    for (size_t j = 0; j < cols; ++j) keep_col[j] = keep_col[j] || row[j] > 0;
  CountTable out;
  for (const auto& row : t) {
    int64_t total = 0;
    std::vector<int64_t> kept;
    for (size_t j = 0; j < cols; ++j)
      if (keep_col[j]) kept.push_back(row[j]), total += row[j];
    if (total > 0) out.push_back(std::move(kept));
  }
  return out;
}

struct Margins {
  std::vector<int64_t> rows, cols;
  int64_t n = 0;
};

Margins MarginsOf(const CountTable& t) {
  Margins m;
  if (t.empty()) return m;
  m.rows.assign(t.size(), 0);
  m.cols.assign(t.front().size(), 0);
  for (size_t i = 0; i < t.size(); ++i)
    for (size_t j = 0; j < t[i].size(); ++j) m.rows[i] += t[i][j], m.cols[j] += t[i][j], m.n += t[i][j];
  return m;
}

double Statistic(const CountTable& t, const Margins& m) {
  double x2 = 0;
  for (size_t i = 0; i < t.size(); ++i)
    for (size_t j = 0; j < t[i].size(); ++j) {
      double e = static_cast<double>(m.rows[i]) * static_cast<double>(m.cols[j]) / static_cast<double>(m.n);
      double d = static_cast<double>(t[i][j]) - e;
      x2 += d * d / e;
    }
  return x2;
}

}  // namespace

double PearsonStatistic(const CountTable& table) {
  CountTable t = Compact(table);
  if (t.empty()) return 0;
  return Statistic(t, MarginsOf(t));
}

int64_t SampleHypergeometric(int64_t draws, int64_t successes, int64_t population, Rng& rng) {
  const int64_t lo = std::max<int64_t>(0, draws + successes - population);
  const int64_t hi = std::min(draws, successes);
  if (lo == hi) return lo;
  const double n = static_cast<double>(draws), K = static_cast<double>(successes), N = static_cast<double>(population);
  int64_t mode = static_cast<int64_t>(std::floor((n + 1) * (K + 1) / (N + 2)));
  mode = std::clamp(mode, lo, hi);
  // Weights relative to the mode: p(x+1)/p(x) = (K-x)(n-x) / ((x+1)(N-K-n+x+1)).
  // Beyond a relative weight of 1e-18 the tail cannot change a double draw.
  std::vector<double> up{1.0}, down;
  for (int64_t x = mode; x < hi; ++x) {
    double xd = static_cast<double>(x);
    double w = up.back() * (K - xd) * (n - xd) / ((xd + 1) * (N - K - n + xd + 1));
    if (w < 1e-18) break;
    up.push_back(w);
  }
  double w = 1.0;
  for (int64_t x = mode; x > lo; --x) {
    double xd = static_cast<double>(x);
    // p(x-1)/p(x) = x (N-K-n+x) / ((K-x+1)(n-x+1))
    w = w * xd * (N - K - n + xd) / ((K - xd + 1) * (n - xd + 1));
    if (w < 1e-18) break;
    down.push_back(w);
  }
  double total = 0;
  for (double v : down) total += v;
  for (double v : up) total += v;
  double u = rng.Uniform() * total;
  // Walk from the lowest kept value upwards.
  for (size_t k = down.size(); k-- > 0;) {
    if (u < down[k]) return mode - 1 - static_cast<int64_t>(k);
    u -= down[k];
  }
  for (size_t k = 0; k < up.size(); ++k) {
    if (u < up[k]) return mode + static_cast<int64_t>(k);
    u -= up[k];
  }
  return mode + static_cast<int64_t>(up.size()) - 1;  // rounding at the very top
}

CountTable RandomTableWithMargins(const std::vector<int64_t>& row_totals, const std::vector<int64_t>& col_totals,
                                  Rng& rng) {
  CountTable t(row_totals.size(), std::vector<int64_t>(col_totals.size(), 0));
  std::vector<int64_t> rows_left = row_totals;
  int64_t units_left = 0;
  for (int64_t r : row_totals) units_left += r;
  for (size_t j = 0; j + 1 < col_totals.size(); ++j) {
    // Draw column j's units from the urn of remaining units, colour by colour.
    int64_t to_place = col_totals[j], pool = units_left;
    for (size_t i = 0; i < rows_left.size() && to_place > 0; ++i) {
      int64_t x = i + 1 == rows_left.size() ? to_place : SampleHypergeometric(to_place, rows_left[i], pool, rng);
      pool -= rows_left[i];
      t[i][j] = x;
      rows_left[i] -= x;
      to_place -= x;
    }
    units_left -= col_totals[j];
  }
  if (!col_totals.empty())
    for (size_t i = 0; i < rows_left.size(); ++i) t[i][col_totals.size() - 1] = rows_left[i];
  return t;
}

IndependenceTest PearsonIndependence(const CountTable& table, uint64_t seed, int replicates) {
  IndependenceTest r;
  CountTable t = Compact(table);
  if (t.empty()) return r;
  Margins m = MarginsOf(t);
  r.n = m.n;
  r.cells = static_cast<int>(t.size() * t.front().size());
  r.df = static_cast<int>((t.size() - 1) * (t.front().size() - 1));
  r.statistic = Statistic(t, m);
  r.min_expected = INFINITY;
  for (int64_t ri : m.rows)
    for (int64_t cj : m.cols) {
      double e = static_cast<double>(ri) * static_cast<double>(cj) / static_cast<double>(m.n);
      r.min_expected = std::min(r.min_expected, e);
      r.cells_below_5 += e < 5;
    }
  if (r.df == 0) return r;  // one row or one column: nothing to test
  boost::math::chi_squared_distribution<double> chi2(r.df);
  r.p_asymptotic = boost::math::cdf(boost::math::complement(chi2, r.statistic));
  r.small_expected = r.min_expected < 1 || 5 * r.cells_below_5 > r.cells;
  if (r.small_expected && replicates > 0) {
    Rng rng(seed);
    // Ties: as R, count a simulated statistic that equals the observed one up
    // to rounding (relative 64 machine epsilons) as at least as large.
    const double threshold = r.statistic * (1 - 64 * DBL_EPSILON);
    int64_t at_least = 0;
    for (int b = 0; b < replicates; ++b)
      at_least += Statistic(RandomTableWithMargins(m.rows, m.cols, rng), m) >= threshold;
    r.replicates = replicates;
    r.p_monte_carlo = static_cast<double>(1 + at_least) / static_cast<double>(replicates + 1);
  }
  return r;
}

}  // namespace twinprobe::stats
