#include "stats/cochran_q.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <unordered_map>

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

// Sorted column totals packed into one integer (base `radix` digits), so the
// distribution lives in a hash map rather than a map of vectors.
uint64_t Pack(const std::vector<int64_t>& totals, uint64_t radix) {
  uint64_t key = 0;
  for (int64_t t : totals) key = key * radix + static_cast<uint64_t>(t);
  return key;
}

// `all_positive` sets add one to every arm's total whatever the arrangement.
std::optional<double> ExactP(int k, const std::vector<int>& row_totals, int64_t all_positive, int64_t observed_sum_sq,
                             int64_t sets) {
  const uint64_t radix = static_cast<uint64_t>(sets) + 1;
  // Keys must fit in 64 bits: radix^k.
  if (static_cast<double>(k) * std::log2(static_cast<double>(radix)) >= 63) return std::nullopt;
  using State = std::vector<int64_t>;
  std::unordered_map<uint64_t, std::pair<State, double>> dist;
  State start(static_cast<size_t>(k), all_positive);
  dist[Pack(start, radix)] = {start, 1.0};
  std::map<int, std::vector<std::vector<int>>> patterns;
  double work = 0;
  for (int r : row_totals) {
    auto& pats = patterns[r];
    if (pats.empty()) pats = Patterns(k, r);
    work += static_cast<double>(dist.size()) * static_cast<double>(pats.size());
    if (work > kMaxExactWork) return std::nullopt;
    const double w = 1.0 / static_cast<double>(pats.size());
    std::unordered_map<uint64_t, std::pair<State, double>> next;
    next.reserve(dist.size() * 2);
    for (const auto& [key, entry] : dist)
      for (const auto& pat : pats) {
        State s = entry.first;
        for (size_t j = 0; j < s.size(); ++j) s[j] += pat[j];
        std::sort(s.begin(), s.end());
        auto& slot = next[Pack(s, radix)];
        if (slot.first.empty()) slot.first = s;
        slot.second += entry.second * w;
      }
    dist.swap(next);
  }
  double p = 0;
  for (const auto& [key, entry] : dist) {
    int64_t ss = 0;
    for (int64_t c : entry.first) ss += c * c;
    if (ss >= observed_sum_sq) p += entry.second;
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
  if (exact) q.p_exact = ExactP(q.k, informative, all_positive, sum_c2, q.sets);
  return q;
}

}  // namespace twinprobe::stats
