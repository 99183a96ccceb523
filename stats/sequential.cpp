#include "stats/sequential.h"

#include <algorithm>
#include <cmath>
#include <functional>

#include "stats/power_internal.h"

namespace twinprobe::stats {
namespace {

// pmf of Binomial(n, 1/2), in log space so large n neither under- nor overflows.
std::vector<double> FairBinomialPmf(int64_t n) {
  std::vector<double> pmf(static_cast<size_t>(n + 1));
  const double nd = static_cast<double>(n);
  const double log_half_n = -nd * std::log(2.0);
  const double lg_n = std::lgamma(nd + 1.0);
  for (int64_t k = 0; k <= n; ++k) {
    const double kd = static_cast<double>(k);
    pmf[k] = std::exp(lg_n - std::lgamma(kd + 1.0) - std::lgamma(nd - kd + 1.0) + log_half_n);
  }
  return pmf;
}

// Distribution of b at the next look: convolve the surviving mass with the
// fair binomial step.
std::vector<double> Step(const std::vector<double>& mass, int64_t step) {
  if (step == 0) return mass;
  const std::vector<double> pmf = FairBinomialPmf(step);
  std::vector<double> next(mass.size() + static_cast<size_t>(step), 0.0);
  for (size_t b = 0; b < mass.size(); ++b) {
    if (mass[b] == 0.0) continue;
    for (size_t x = 0; x < pmf.size(); ++x) next[b + x] += mass[b] * pmf[x];
  }
  return next;
}

// Mass of `dist` at b <= lower or b >= n - lower (both tails; lower < n/2).
double TailMass(const std::vector<double>& dist, int64_t lower) {
  if (lower < 0) return 0.0;
  const int64_t n = static_cast<int64_t>(dist.size()) - 1;
  double s = 0.0;
  for (int64_t b = 0; b <= lower; ++b) s += dist[b] + dist[n - b];
  return s;
}

}  // namespace

bool ParseSpending(const std::string& name, Spending& out) {
  if (name == "obf") out = Spending::kOBrienFleming;
  else if (name == "pocock") out = Spending::kPocock;
  else return false;
  return true;
}

std::string SpendingName(Spending s) { return s == Spending::kOBrienFleming ? "obf" : "pocock"; }

std::string SpendingLabel(Spending s) {
  return s == Spending::kOBrienFleming ? "O'Brien\u2013Fleming-type" : "Pocock-type";
}

double AlphaSpent(Spending s, double alpha, double t) {
  if (t <= 0) return 0.0;
  if (t >= 1) return alpha;
  if (s == Spending::kPocock) return alpha * std::log1p((std::exp(1.0) - 1.0) * t);
  const double z = internal::NormalQuantile(1.0 - alpha / 4.0);
  return 4.0 * internal::NormalCdf(-z / std::sqrt(t));  // upper tail without cancellation
}

std::vector<SequentialBoundary> ExactSequentialBoundaries(const std::vector<SequentialLook>& looks, double alpha,
                                                          Spending spending) {
  return ContinueSequentialBoundaries({}, looks, alpha, spending);
}

std::vector<SequentialBoundary> ContinueSequentialBoundaries(const std::vector<SequentialBoundary>& taken,
                                                             const std::vector<SequentialLook>& looks, double alpha,
                                                             Spending spending) {
  std::vector<SequentialBoundary> out;
  std::vector<double> mass{1.0};  // P(b = j and not stopped yet), j = 0..n
  int64_t n_prev = 0;
  double spent = 0.0;
  // The looks already taken keep their boundaries; only what they spent is
  // recomputed, so the new looks see the alpha they left.
  for (SequentialBoundary bd : taken) {
    std::vector<double> dist = Step(mass, bd.n_discordant - n_prev);
    const int64_t n = bd.n_discordant;
    bd.alpha_here = TailMass(dist, bd.lower);
    spent += bd.alpha_here;
    bd.alpha_spent = spent;
    for (int64_t b = 0; b <= bd.lower; ++b) dist[b] = dist[n - b] = 0.0;
    mass = std::move(dist);
    n_prev = n;
    out.push_back(bd);
  }
  for (const auto& look : looks) {
    SequentialBoundary bd;
    bd.information = look.information;
    bd.n_discordant = look.n_discordant;
    bd.alpha_allowed = AlphaSpent(spending, alpha, look.information);
    std::vector<double> dist = Step(mass, look.n_discordant - n_prev);
    // Widen the boundary one count at a time while the cumulative crossing
    // probability stays within alpha(t).
    const int64_t n = look.n_discordant;
    double here = 0.0;
    int64_t lower = -1;
    for (int64_t l = 0; 2 * l < n; ++l) {
      const double add = dist[l] + dist[n - l];
      if (spent + here + add > bd.alpha_allowed) break;
      here += add;
      lower = l;
    }
    bd.lower = lower;
    bd.alpha_here = here;
    spent += here;
    bd.alpha_spent = spent;
    for (int64_t b = 0; b <= lower; ++b) dist[b] = dist[n - b] = 0.0;
    mass = std::move(dist);
    n_prev = n;
    out.push_back(bd);
  }
  return out;
}

double StagewisePValue(const std::vector<SequentialBoundary>& bounds, size_t stop, int64_t b_observed) {
  std::vector<double> mass{1.0};
  int64_t n_prev = 0;
  double p = 0.0;
  for (size_t k = 0; k <= stop && k < bounds.size(); ++k) {
    const auto& bd = bounds[k];
    std::vector<double> dist = Step(mass, bd.n_discordant - n_prev);
    const int64_t n = bd.n_discordant;
    if (k == stop) {
      // As far from n/2 as observed, or farther: b <= min(b, n-b) or b >= max(b, n-b).
      const int64_t near = std::min(b_observed, n - b_observed);
      for (int64_t b = 0; b <= n; ++b)
        if (b <= near || b >= n - near) p += dist[b];
      break;
    }
    p += TailMass(dist, bd.lower);
    for (int64_t b = 0; b <= bd.lower; ++b) dist[b] = dist[n - b] = 0.0;
    mass = std::move(dist);
    n_prev = n;
  }
  return std::min(p, 1.0);
}

double EnumeratedTypeIError(const std::vector<SequentialBoundary>& bounds) {
  // Walk every combination of increments x_k ~ Binomial(n_k - n_{k-1}, 1/2),
  // multiplying their probabilities, and add the probability of each path
  // at the look where it first crosses.
  std::vector<std::vector<double>> pmfs;
  int64_t n_prev = 0;
  for (const auto& bd : bounds) {
    pmfs.push_back(FairBinomialPmf(bd.n_discordant - n_prev));
    n_prev = bd.n_discordant;
  }
  double total = 0.0;
  std::function<void(size_t, int64_t, double)> walk = [&](size_t k, int64_t b, double prob) {
    if (k == bounds.size()) return;
    for (size_t x = 0; x < pmfs[k].size(); ++x) {
      const int64_t bk = b + static_cast<int64_t>(x);
      const double pk = prob * pmfs[k][x];
      if (bounds[k].crossed_by(bk)) total += pk;
      else walk(k + 1, bk, pk);
    }
  };
  walk(0, 0, 1.0);
  return total;
}

}  // namespace twinprobe::stats
