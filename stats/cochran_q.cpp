#include "stats/cochran_q.h"

#include <algorithm>
#include <cmath>
#include <map>

#include <boost/math/special_functions/binomial.hpp>

#include "stats/pvalue.h"

namespace twinprobe::stats {
namespace {

// Every k-vector of 0/1 with r ones.
std::vector<std::vector<int>> Patterns(int k, int r) {
  std::vector<std::vector<int>> out;
  std::vector<int> v(static_cast<size_t>(k), 0);
  std::fill(v.end() - r, v.end(), 1);
  do out.push_back(v);
  while (std::next_permutation(v.begin(), v.end()));
  return out;
}

// `all_positive` sets add one to every arm's total whatever the arrangement.
std::optional<double> ExactP(int k, const std::vector<int>& row_totals, int64_t all_positive, int64_t observed_sum_sq) {
  using State = std::vector<int64_t>;
  std::map<State, double> dist{{State(static_cast<size_t>(k), all_positive), 1.0}};
  std::map<int, std::vector<std::vector<int>>> patterns;
  for (int r : row_totals) {
    auto& pats = patterns[r];
    if (pats.empty()) pats = Patterns(k, r);
    const double w = 1.0 / static_cast<double>(pats.size());
    std::map<State, double> next;
    for (const auto& [state, prob] : dist)
      for (const auto& pat : pats) {
        State s = state;
        for (size_t j = 0; j < s.size(); ++j) s[j] += pat[j];
        std::sort(s.begin(), s.end());
        next[s] += prob * w;
      }
    if (static_cast<int64_t>(next.size()) > kMaxExactStates) return std::nullopt;
    dist.swap(next);
  }
  double p = 0;
  for (const auto& [state, prob] : dist) {
    int64_t ss = 0;
    for (int64_t c : state) ss += c * c;
    if (ss >= observed_sum_sq) p += prob;
  }
  return std::min(1.0, p);
}

}  // namespace

CochranQ CochranQTest(const std::vector<std::vector<int>>& sets, bool exact) {
  CochranQ q;
  if (sets.empty()) return q;
  q.k = static_cast<int>(sets[0].size());
  q.df = q.k - 1;
  q.positives.assign(static_cast<size_t>(q.k), 0);
  int64_t n = 0, sum_r2 = 0;
  std::vector<int> informative;
  int64_t all_positive = 0;
  for (const auto& row : sets) {
    int r = 0;
    for (size_t j = 0; j < row.size(); ++j) r += row[j], q.positives[j] += row[j];
    n += r;
    sum_r2 += static_cast<int64_t>(r) * r;
    ++q.sets;
    if (r > 0 && r < q.k) informative.push_back(r), ++q.informative_sets;
    if (r == q.k) ++all_positive;
  }
  int64_t sum_c2 = 0;
  for (int64_t c : q.positives) sum_c2 += c * c;
  const double denominator = static_cast<double>(q.k) * static_cast<double>(n) - static_cast<double>(sum_r2);
  if (q.informative_sets == 0 || denominator <= 0) {
    q.p_exact = 1.0;
    return q;
  }
  q.statistic = (q.k - 1) * (static_cast<double>(q.k) * static_cast<double>(sum_c2) - static_cast<double>(n) * n) /
                denominator;
  q.p_asymptotic = ChiSquareUpper(std::max(0.0, q.statistic), q.df).p;
  if (exact) q.p_exact = ExactP(q.k, informative, all_positive, sum_c2);
  return q;
}

}  // namespace twinprobe::stats
