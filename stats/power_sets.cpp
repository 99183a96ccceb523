#include "stats/power_sets.h"

#include <algorithm>
#include <cmath>
#include <tuple>
#include <utility>

#include <boost/math/distributions/chi_squared.hpp>

#include "stats/adjust.h"
#include "stats/mcnemar.h"
#include "stats/random.h"

namespace twinprobe::stats {
namespace {

// Everything about the k arms that the Q statistic needs per pattern.
struct Patterns {
  int k = 0;
  std::vector<double> prob;         // P(pattern) for one vacancy
  std::vector<std::vector<int>> bits;
  std::vector<int> row_total;
  double critical = 0;              // qchisq(1 - alpha, k - 1)
  double alpha = 0;
  std::vector<std::pair<int, int>> pairs;  // every pair of arms, (0,1), (0,2), ..., (1,2), ...
  int smallest = -1;                       // index in `pairs` of the smallest nonzero gap
};

Patterns MakePatterns(const std::vector<double>& rates, double alpha) {
  Patterns p;
  p.k = static_cast<int>(rates.size());
  const int count = 1 << p.k;
  for (int pat = 0; pat < count; ++pat) {
    double q = 1;
    std::vector<int> b;
    for (int j = 0; j < p.k; ++j) {
      const int on = (pat >> j) & 1;
      b.push_back(on);
      q *= on ? rates[static_cast<size_t>(j)] : 1 - rates[static_cast<size_t>(j)];
    }
    p.prob.push_back(q);
    p.row_total.push_back(static_cast<int>(std::count(b.begin(), b.end(), 1)));
    p.bits.push_back(std::move(b));
  }
  p.critical = boost::math::quantile(boost::math::complement(boost::math::chi_squared(p.k - 1), alpha));
  p.alpha = alpha;
  const SmallestGap gap = SmallestPairwiseGap(rates);
  for (int i = 0; i < p.k; ++i)
    for (int j = i + 1; j < p.k; ++j) {
      if (i == gap.first && j == gap.second) p.smallest = static_cast<int>(p.pairs.size());
      p.pairs.emplace_back(i, j);
    }
  return p;
}

// Does Holm's step-down adjustment over every pair's exact McNemar p reject
// the smallest-gap pair, as the analysis tests it (stats/pairwise.h)?
bool HolmRejectsSmallest(const Patterns& p, const std::vector<int64_t>& counts) {
  if (p.smallest < 0) return false;
  std::vector<double> pvalues;
  for (const auto& [i, j] : p.pairs) {
    PairedCounts t;
    for (size_t pat = 0; pat < counts.size(); ++pat) {
      const int x = p.bits[pat][static_cast<size_t>(i)], y = p.bits[pat][static_cast<size_t>(j)];
      (x ? (y ? t.a : t.b) : (y ? t.c : t.d)) += counts[pat];
    }
    pvalues.push_back(McNemarExactP(t));
  }
  return AdjustP(pvalues, Adjustment::kHolm)[static_cast<size_t>(p.smallest)] < p.alpha;
}

// Does a study with `counts[pattern]` vacancies of each pattern reject?
bool Rejects(const Patterns& p, const std::vector<int64_t>& counts) {
  std::vector<double> c(static_cast<size_t>(p.k), 0.0);
  double n = 0, sum_r2 = 0;
  for (size_t pat = 0; pat < counts.size(); ++pat) {
    if (!counts[pat]) continue;
    const double m = static_cast<double>(counts[pat]);
    const double r = p.row_total[pat];
    n += m * r;
    sum_r2 += m * r * r;
    for (int j = 0; j < p.k; ++j) c[static_cast<size_t>(j)] += m * p.bits[pat][static_cast<size_t>(j)];
  }
  const double denominator = p.k * n - sum_r2;
  if (denominator <= 0) return false;
  double sum_c2 = 0;
  for (double v : c) sum_c2 += v * v;
  const double q = (p.k - 1) * (p.k * sum_c2 - n * n) / denominator;
  return q >= p.critical;
}

struct Enumerate {
  const Patterns& p;
  std::vector<int64_t> counts;
  std::vector<double> log_prob;
  double log_n_factorial = 0;
  double power = 0;
  double holm_power = 0;  // the smallest-gap pair rejected after Holm

  void Walk(size_t pat, int64_t left, double log_weight) {
    if (pat + 1 == counts.size()) {
      counts[pat] = left;
      const double lw = log_weight + MultTerm(pat, left);
      if (!std::isfinite(lw)) return;
      const double weight = std::exp(log_n_factorial + lw);
      if (Rejects(p, counts)) power += weight;
      if (HolmRejectsSmallest(p, counts)) holm_power += weight;
      return;
    }
    for (int64_t m = 0; m <= left; ++m) {
      counts[pat] = m;
      Walk(pat + 1, left - m, log_weight + MultTerm(pat, m));
    }
    counts[pat] = 0;
  }
  // log(q^m / m!), with 0^0 = 1.
  double MultTerm(size_t pat, int64_t m) const {
    if (m == 0) return 0.0;
    return static_cast<double>(m) * log_prob[pat] - std::lgamma(static_cast<double>(m) + 1);
  }
};

}  // namespace

double SetsCompositions(int64_t vacancies, int k) {
  const double patterns = std::ldexp(1.0, k);
  return std::exp(std::lgamma(static_cast<double>(vacancies) + patterns) -
                  std::lgamma(static_cast<double>(vacancies) + 1) - std::lgamma(patterns));
}

namespace {

// Both powers by exact enumeration ({overall, holm}).
std::pair<double, double> ExactPowers(int64_t vacancies, const std::vector<double>& rates, double alpha) {
  const Patterns p = MakePatterns(rates, alpha);
  Enumerate e{p, std::vector<int64_t>(p.prob.size(), 0), {}, std::lgamma(static_cast<double>(vacancies) + 1), 0, 0};
  for (double q : p.prob) e.log_prob.push_back(q > 0 ? std::log(q) : -HUGE_VAL);
  e.Walk(0, vacancies, 0.0);
  return {std::min(1.0, e.power), std::min(1.0, e.holm_power)};
}

// Both powers from `replicates` simulated studies ({overall, holm}); the
// Holm evaluation only when asked (the sample-size search does not need it).
std::pair<double, double> SimulatedPowers(int64_t vacancies, const std::vector<double>& rates, double alpha,
                                          uint64_t seed, int replicates, bool with_holm) {
  const Patterns p = MakePatterns(rates, alpha);
  std::vector<double> cumulative;
  double total = 0;
  for (double q : p.prob) cumulative.push_back(total += q);
  Rng rng(seed);
  std::vector<int64_t> counts(p.prob.size());
  int rejected = 0, holm_rejected = 0;
  for (int rep = 0; rep < replicates; ++rep) {
    std::fill(counts.begin(), counts.end(), 0);
    for (int64_t v = 0; v < vacancies; ++v) {
      const double u = rng.Uniform() * total;
      const auto it = std::upper_bound(cumulative.begin(), cumulative.end(), u);
      ++counts[static_cast<size_t>(std::min<std::ptrdiff_t>(it - cumulative.begin(),
                                                            static_cast<std::ptrdiff_t>(counts.size()) - 1))];
    }
    rejected += Rejects(p, counts);
    if (with_holm) holm_rejected += HolmRejectsSmallest(p, counts);
  }
  return {static_cast<double>(rejected) / replicates, static_cast<double>(holm_rejected) / replicates};
}

}  // namespace

double ExactCochranPower(int64_t vacancies, const std::vector<double>& rates, double alpha) {
  return ExactPowers(vacancies, rates, alpha).first;
}

double SimulatedCochranPower(int64_t vacancies, const std::vector<double>& rates, double alpha, uint64_t seed,
                             int replicates) {
  return SimulatedPowers(vacancies, rates, alpha, seed, replicates, false).first;
}

SmallestGap SmallestPairwiseGap(const std::vector<double>& rates) {
  SmallestGap g;
  double best = HUGE_VAL;
  for (size_t i = 0; i < rates.size(); ++i)
    for (size_t j = i + 1; j < rates.size(); ++j) {
      const double gap = std::abs(rates[i] - rates[j]);
      if (gap > 0 && gap < best) {
        best = gap;
        g.first = static_cast<int>(i);
        g.second = static_cast<int>(j);
        g.alt = {rates[i] * (1 - rates[j]), rates[j] * (1 - rates[i])};
      }
    }
  return g;
}

SetsPower PowerForSets(int64_t vacancies, const std::vector<double>& rates, double alpha, uint64_t seed,
                       int replicates, bool allow_exact) {
  SetsPower s;
  const int k = static_cast<int>(rates.size());
  if (allow_exact && SetsCompositions(vacancies, k) <= kMaxSetsCompositions) {
    std::tie(s.overall, s.pairwise_holm) = ExactPowers(vacancies, rates, alpha);
    s.overall_exact = true;
  } else {
    std::tie(s.overall, s.pairwise_holm) = SimulatedPowers(vacancies, rates, alpha, seed, replicates, true);
    s.replicates = replicates;
    s.overall_se = std::sqrt(s.overall * (1 - s.overall) / replicates);
    s.pairwise_holm_se = std::sqrt(s.pairwise_holm * (1 - s.pairwise_holm) / replicates);
  }
  s.alpha_pairwise = alpha / (k * (k - 1) / 2);
  const SmallestGap g = SmallestPairwiseGap(rates);
  s.pair_first = g.first;
  s.pair_second = g.second;
  if (g.first >= 0) s.pairwise = McNemarExactPower(vacancies, g.alt, s.alpha_pairwise);
  return s;
}

SetsSampleSize SampleSizeForSets(const std::vector<double>& rates, double alpha, double target, uint64_t seed,
                                 int replicates, int64_t max_vacancies) {
  SetsSampleSize out;
  const int k = static_cast<int>(rates.size());
  const SmallestGap g = SmallestPairwiseGap(rates);
  if (g.first < 0) return out;
  const ExactSampleSize pair = McNemarExactSampleSize(g.alt, alpha / (k * (k - 1) / 2), target, max_vacancies);
  out.pairwise_found = pair.found;
  out.pairwise = pair.n_stable;
  auto power = [&](int64_t n) { return SimulatedCochranPower(n, rates, alpha, seed, replicates); };
  int64_t lo = 1, hi = 8;
  while (power(hi) < target) {
    lo = hi;
    hi *= 2;
    if (hi > max_vacancies) return out;
  }
  while (hi - lo > 1) {
    const int64_t mid = lo + (hi - lo) / 2;
    (power(mid) >= target ? hi : lo) = mid;
  }
  out.overall_found = true;
  out.overall = hi;
  return out;
}

}  // namespace twinprobe::stats
