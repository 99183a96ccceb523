#include "stats/power_paired.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/special_functions/beta.hpp>

#include "stats/mcnemar.h"
#include "stats/power_internal.h"

namespace twinprobe::stats {
namespace {

using internal::BinomialWeights;
using internal::FastPolicy;

// Outer binomial tail left out of every sum (see the header).
constexpr double kTailMass = 1e-17;

bool Rejects(int64_t k, int64_t nd, double alpha) {
  // The very test the analysis runs, so power and analysis cannot drift apart.
  return McNemarExactP(PairedCounts{0, k, nd - k, 0}) <= alpha;
}

// k_nd starting from a guess: step up while k+1 still rejects, down while k
// does not. From nd-1 to nd the bound moves by at most one (a binomial
// quantile argument), so from the previous bound this takes one or two tests.
int64_t BoundFrom(int64_t guess, int64_t nd, double alpha) {
  int64_t k = std::clamp<int64_t>(guess, -1, (nd - 1) / 2);
  while (k >= 0 && !Rejects(k, nd, alpha)) --k;
  while (k + 1 <= (nd - 1) / 2 && Rejects(k + 1, nd, alpha)) ++k;
  return k;
}

// g(nd) = P(b <= k) + P(b >= nd - k) for b ~ Binomial(nd, pi).
double ConditionalPower(int64_t nd, int64_t k, double pi) {
  if (k < 0) return 0.0;
  const double lower_tail = boost::math::ibetac(static_cast<double>(k + 1), static_cast<double>(nd - k), pi,
                                                FastPolicy());                          // P(b <= k)
  const double upper_tail = boost::math::ibeta(static_cast<double>(nd - k), static_cast<double>(k + 1), pi,
                                               FastPolicy());                           // P(b >= nd - k)
  return lower_tail + upper_tail;
}

double Pi(const PairedAlternative& alt) { return alt.p10 / alt.discordant(); }

}  // namespace

PairedAlternative AlternativeFromRates(double rate_reference, double rate_other, double both) {
  return PairedAlternative{rate_reference - both, rate_other - both};
}

PairedAlternative WithLosses(const PairedAlternative& alt, double lost) {
  return PairedAlternative{alt.p10 * (1.0 - lost), alt.p01 * (1.0 - lost)};
}

int64_t McNemarRejectionBound(int64_t n_discordant, double alpha) {
  // Binary search: rejection at k implies rejection at every smaller k.
  int64_t lo = -1, hi = (n_discordant - 1) / 2;  // answer in [lo, hi]
  while (lo < hi) {
    int64_t mid = lo + (hi - lo + 1) / 2;
    if (Rejects(mid, n_discordant, alpha)) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

double McNemarExactPower(int64_t n_sets, const PairedAlternative& alt, double alpha) {
  BinomialWeights w;
  internal::FillBinomialWeights(n_sets, alt.discordant(), kTailMass, w);
  const double pi = Pi(alt);
  int64_t k = McNemarRejectionBound(w.lo, alpha);
  double power = 0.0;
  for (size_t i = 0; i < w.weights.size(); ++i) {
    const int64_t nd = w.lo + static_cast<int64_t>(i);
    if (i > 0) k = BoundFrom(k, nd, alpha);
    power += w.weights[i] * ConditionalPower(nd, k, pi);
  }
  return std::min(power, 1.0);
}

McNemarPowerCalculator::McNemarPowerCalculator(const PairedAlternative& alt, double alpha)
    : alt_(alt), alpha_(alpha), pi_(Pi(alt)) {}

void McNemarPowerCalculator::Extend(int64_t nd_max) {
  for (int64_t nd = static_cast<int64_t>(g_.size()); nd <= nd_max; ++nd) {
    const int64_t k = nd == 0 ? -1 : BoundFrom(k_.back(), nd, alpha_);
    const double g = ConditionalPower(nd, k, pi_);
    k_.push_back(k);
    g_.push_back(g);
    g_max_.push_back(g_max_.empty() ? g : std::max(g_max_.back(), g));
  }
}

std::pair<int64_t, int64_t> McNemarPowerCalculator::DiscordantRange(int64_t n_sets) const {
  BinomialWeights w;
  internal::FillBinomialWeights(n_sets, alt_.discordant(), kTailMass, w);
  return {w.lo, w.hi()};
}

template <typename F>
double McNemarPowerCalculator::Expect(int64_t n_sets, F&& value_of) const {
  thread_local BinomialWeights w;
  internal::FillBinomialWeights(n_sets, alt_.discordant(), kTailMass, w);
  double sum = 0.0;
  for (size_t i = 0; i < w.weights.size(); ++i) sum += w.weights[i] * value_of(w.lo + static_cast<int64_t>(i));
  return sum;
}

double McNemarPowerCalculator::Power(int64_t n_sets) {
  Extend(DiscordantRange(n_sets).second);
  return std::min(1.0, Expect(n_sets, [this](int64_t nd) { return g_[nd]; }));
}

double McNemarPowerCalculator::UpperBound(int64_t n_sets) {
  Extend(DiscordantRange(n_sets).second);
  // The left-out tail could hold g = 1 at most.
  return Expect(n_sets, [this](int64_t nd) { return g_max_[nd]; }) + 2 * kTailMass;
}

void McNemarPowerCalculator::SetLowerCap(int64_t n_sets_max) {
  const int64_t cap = DiscordantRange(n_sets_max).second;
  Extend(cap);
  lower_cap_ = cap;
  g_min_.assign(cap + 1, 0.0);
  double m = std::numeric_limits<double>::infinity();
  for (int64_t nd = cap; nd >= 0; --nd) g_min_[nd] = m = std::min(m, g_[nd]);
}

double McNemarPowerCalculator::LowerBound(int64_t n_sets) {
  // Beyond the cap the minimum is unknown: count those terms as 0 (lower bound).
  return Expect(n_sets, [this](int64_t nd) { return nd <= lower_cap_ ? g_min_[nd] : 0.0; });
}

ExactSampleSize McNemarExactSampleSize(const PairedAlternative& alt, double alpha, double target, int64_t max_sets) {
  ExactSampleSize out;
  McNemarPowerCalculator calc(alt, alpha);

  // 1. Every N with UpperBound(N) < target has power below target, and the
  //    bound only grows with N: find the last such N by doubling + bisection.
  int64_t below = 0, above = 1;  // UpperBound(below) < target <= UpperBound(above)
  while (calc.UpperBound(above) < target) {
    below = above;
    if (above >= max_sets) return out;
    above = std::min(max_sets, above * 2);
  }
  while (above - below > 1) {
    int64_t mid = below + (above - below) / 2;
    (calc.UpperBound(mid) < target ? below : above) = mid;
  }
  // 2. Scan upwards for the first N that reaches the target.
  int64_t n = below + 1;
  double p = 0;
  for (; n <= max_sets; ++n)
    if ((p = calc.Power(n)) >= target) break;
  if (n > max_sets) return out;
  out.found = true;
  out.n_first = n;
  out.power_first = p;
  out.horizon = 2 * n;

  // 3. Lower bounds: from the first N with LowerBound(N) >= target every N up
  //    to the horizon keeps the target. Below it, scan downwards for the last
  //    dip under the target.
  calc.SetLowerCap(out.horizon);
  constexpr double kMargin = 1e-15;  // the bound is monotone up to the left-out tail
  int64_t lo = out.n_first, hi = out.horizon + 1;  // first N with bound >= target lies in [lo, hi]
  while (lo < hi) {
    int64_t mid = lo + (hi - lo) / 2;
    if (calc.LowerBound(mid) >= target + kMargin) hi = mid;
    else lo = mid + 1;
  }
  out.n_stable = out.n_first;
  for (int64_t m = std::min(lo, out.horizon + 1) - 1; m > out.n_first; --m)
    if (calc.Power(m) < target) {
      out.n_stable = m + 1;
      break;
    }
  out.power_stable = calc.Power(out.n_stable);
  return out;
}

namespace {

double AsymptoticSampleSize(const PairedAlternative& alt, double alpha, double power, int sides, double var_alt) {
  const double psi = alt.discordant();
  const double delta = alt.p10 - alt.p01;
  const double za = internal::NormalQuantile(1.0 - alpha / sides);
  const double zb = internal::NormalQuantile(power);
  const double root = za * std::sqrt(psi) + zb * std::sqrt(var_alt);
  return root * root / (delta * delta);
}

double AsymptoticPower(double n, const PairedAlternative& alt, double alpha, int sides, double var_alt) {
  const double psi = alt.discordant();
  const double delta = std::fabs(alt.p10 - alt.p01);
  const double za = internal::NormalQuantile(1.0 - alpha / sides);
  const double sd = std::sqrt(var_alt);
  double power = internal::NormalCdf((delta * std::sqrt(n) - za * std::sqrt(psi)) / sd);
  if (sides == 2) power += internal::NormalCdf((-delta * std::sqrt(n) - za * std::sqrt(psi)) / sd);
  return power;
}

double ConnorVariance(const PairedAlternative& alt) {
  const double d = alt.p10 - alt.p01;
  return alt.discordant() - d * d;
}

double MiettinenVariance(const PairedAlternative& alt) {
  const double d = alt.p10 - alt.p01;
  const double psi = alt.discordant();
  return psi - d * d * (3.0 + psi) / 4.0;
}

}  // namespace

double ConnorSampleSize(const PairedAlternative& alt, double alpha, double power, int sides) {
  return AsymptoticSampleSize(alt, alpha, power, sides, ConnorVariance(alt));
}

double ConnorPower(double n_sets, const PairedAlternative& alt, double alpha, int sides) {
  return AsymptoticPower(n_sets, alt, alpha, sides, ConnorVariance(alt));
}

double MiettinenSampleSize(const PairedAlternative& alt, double alpha, double power, int sides) {
  return AsymptoticSampleSize(alt, alpha, power, sides, MiettinenVariance(alt));
}

double MiettinenPower(double n_sets, const PairedAlternative& alt, double alpha, int sides) {
  return AsymptoticPower(n_sets, alt, alpha, sides, MiettinenVariance(alt));
}

double McNemarDetectableRatio(int64_t n_sets, double rate_reference, double both, double alpha, double target,
                              double lost) {
  auto power_at = [&](double rate_other) {
    return McNemarExactPower(n_sets, WithLosses(AlternativeFromRates(rate_reference, rate_other, both), lost), alpha);
  };
  // The other arm's rate runs from `both` (largest gap) to the reference rate
  // (no gap). Bisect for the highest rate that still reaches the target.
  double strong = both, weak = rate_reference;
  if (strong <= 0) strong = 1e-12;  // rate 0 is the limit, not a usable alternative
  if (power_at(strong) < target) return 0.0;
  while (weak - strong > 1e-9 * rate_reference) {
    const double mid = 0.5 * (strong + weak);
    (power_at(mid) >= target ? strong : weak) = mid;
  }
  return rate_reference / strong;
}

double McNemarDetectableDifference(int64_t n_sets, double discordant, double alpha, double target, double lost) {
  auto power_at = [&](double delta) {
    return McNemarExactPower(n_sets, WithLosses({(discordant + delta) / 2, (discordant - delta) / 2}, lost), alpha);
  };
  double strong = discordant, weak = 0.0;
  if (power_at(strong) < target) return 0.0;
  while (strong - weak > 1e-9 * discordant) {
    const double mid = 0.5 * (strong + weak);
    (power_at(mid) >= target ? strong : weak) = mid;
  }
  return strong;
}

}  // namespace twinprobe::stats
