#include "stats/power_paired.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/distributions/binomial.hpp>
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
  // For k < nd/2 the exact McNemar p is 2 P(X <= k), X ~ Binomial(nd, 1/2).
  // Boost's double-precision incomplete beta is about 15 times faster than
  // the long-double one McNemarExactP uses and accurate to ~1e-14; only when
  // p lies within 1e-9 of alpha does the analysis's own function decide, so
  // power and analysis agree on every table.
  const double p =
      2.0 * boost::math::ibetac(static_cast<double>(k + 1), static_cast<double>(nd - k), 0.5, FastPolicy());
  if (std::fabs(p - alpha) > 1e-9 * alpha) return p <= alpha;
  return McNemarExactP(PairedCounts{0, k, nd - k, 0}) <= alpha;
}

// g(nd) = P(b <= k) + P(b >= nd - k) for b ~ Binomial(nd, pi), directly.
double ConditionalPowerDirect(int64_t nd, int64_t k, double pi) {
  if (k < 0) return 0.0;
  const double lower_tail = boost::math::ibetac(static_cast<double>(k + 1), static_cast<double>(nd - k), pi,
                                                FastPolicy());                          // P(b <= k)
  const double upper_tail = boost::math::ibeta(static_cast<double>(nd - k), static_cast<double>(k + 1), pi,
                                               FastPolicy());                           // P(b >= nd - k)
  return lower_tail + upper_tail;
}

// Binomial pmf, accurate for large n (Boost: incomplete beta derivative).
double Pmf(double n, double j, double p) {
  return boost::math::pdf(boost::math::binomial_distribution<double, FastPolicy>(n, p), j);
}

// The rejection bound k_nd and the conditional power g(nd) for nd = start,
// start + 1, … in a few flops per step. Going from nd to nd + 1 adds one
// Bernoulli trial, so every tail and point probability follows from the
// previous ones:
//   P_{n+1}(B <= k)     = P_n(B <= k) - pi P_n(B = k)
//   P_{n+1}(B >= m + 1) = P_n(B >= m) - (1 - pi) P_n(B = m)
//   P_{n+1}(B = j)      = P_n(B = j) (n + 1) / (n + 1 - j) (1 - pi)
// (the same with pi = 1/2 for the null distribution that places k). The bound
// never falls and rises by at most one per step (P(X_{n+1} <= k) <= P(X_n <=
// k) <= P(X_{n+1} <= k + 1)), so one comparison per step places it. These
// updates add absolute errors of about 1e-16 per step and never amplify them;
// every kAnchorEvery steps all values are recomputed exactly (incomplete beta,
// log-space pmf) so the error stays below 1e-14. The rejection decision falls
// back to McNemarExactP within 1e-9 of alpha, as Rejects does.
class ConditionalWalk {
 public:
  ConditionalWalk(double pi, double alpha) : pi_(pi), alpha_(alpha), direct_(!(pi > 0.0 && pi < 1.0)) {}

  void Start(int64_t nd) {
    nd_ = nd;
    k_ = McNemarRejectionBound(nd, alpha_);
    Anchor();
  }

  void Advance() {
    if (direct_ || k_ < 0 || steps_ >= kAnchorEvery) {
      ++nd_;
      k_ = NextBoundDirect();
      Anchor();
      return;
    }
    const double n1 = static_cast<double>(nd_ + 1), k = static_cast<double>(k_), m = static_cast<double>(nd_ - k_);
    null_cdf_ -= 0.5 * null_pk_;
    null_pk_ *= n1 / (n1 - k) * 0.5;
    lower_ -= pi_ * pk_;
    pk_ *= n1 / (n1 - k) * (1.0 - pi_);
    upper_ -= (1.0 - pi_) * pm_;
    pm_ *= n1 / (m + 1.0) * pi_;
    ++nd_;
    ++steps_;
    if (k_ + 1 <= (nd_ - 1) / 2) {
      const double null_next = null_pk_ * (n1 - k) / (k + 1.0);
      if (RejectsWith(2.0 * (null_cdf_ + null_next), k_ + 1)) {
        ++k_;
        null_cdf_ += null_next;
        null_pk_ = null_next;
        pk_ *= (n1 - k) / (k + 1.0) * pi_ / (1.0 - pi_);  // P_{n+1}(B = k + 1)
        lower_ += pk_;
        pm_ *= (m + 1.0) / (n1 - m) * (1.0 - pi_) / pi_;  // P_{n+1}(B = m): the upper threshold moves down
        upper_ += pm_;
      }
    }
  }

  int64_t nd() const { return nd_; }
  int64_t bound() const { return k_; }
  double g() const { return k_ < 0 ? 0.0 : std::clamp(lower_ + upper_, 0.0, 1.0); }

 private:
  static constexpr int kAnchorEvery = 64;

  bool RejectsWith(double p, int64_t k) const {
    if (std::fabs(p - alpha_) > 1e-9 * alpha_) return p <= alpha_;
    return McNemarExactP(PairedCounts{0, k, nd_ - k, 0}) <= alpha_;
  }

  int64_t NextBoundDirect() const {
    int64_t k = k_;
    while (k + 1 <= (nd_ - 1) / 2 && Rejects(k + 1, nd_, alpha_)) ++k;
    return k;
  }

  void Anchor() {
    steps_ = 0;
    if (k_ < 0) {
      null_cdf_ = null_pk_ = lower_ = pk_ = upper_ = pm_ = 0.0;
      return;
    }
    const double n = static_cast<double>(nd_), k = static_cast<double>(k_);
    lower_ = boost::math::ibetac(k + 1.0, n - k, pi_, FastPolicy());
    upper_ = boost::math::ibeta(n - k, k + 1.0, pi_, FastPolicy());
    if (direct_) return;
    null_cdf_ = boost::math::ibetac(k + 1.0, n - k, 0.5, FastPolicy());
    null_pk_ = Pmf(n, k, 0.5);
    pk_ = Pmf(n, k, pi_);
    pm_ = Pmf(n, n - k, pi_);
  }

  double pi_, alpha_;
  bool direct_;  // pi is 0 or 1: no pmf recurrences, every step exact
  int64_t nd_ = 0, k_ = -1;
  int steps_ = 0;
  double null_cdf_ = 0, null_pk_ = 0;  // P(X <= k), P(X = k), X ~ Binomial(nd, 1/2)
  double lower_ = 0, pk_ = 0;          // P(B <= k), P(B = k)
  double upper_ = 0, pm_ = 0;          // P(B >= nd - k), P(B = nd - k)
};

double Pi(const PairedAlternative& alt) { return alt.p10 / alt.discordant(); }

}  // namespace

PairedAlternative AlternativeFromRates(double rate_reference, double rate_other, double both) {
  return PairedAlternative{rate_reference - both, rate_other - both};
}

PairedAlternative WithLosses(const PairedAlternative& alt, double lost) {
  return PairedAlternative{alt.p10 * (1.0 - lost), alt.p01 * (1.0 - lost)};
}

double McNemarConditionalPower(int64_t n_discordant, double pi, double alpha) {
  return ConditionalPowerDirect(n_discordant, McNemarRejectionBound(n_discordant, alpha), pi);
}

int64_t McNemarRejectionBound(int64_t n_discordant, double alpha) {
  if (n_discordant <= 0) return -1;
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
  ConditionalWalk walk(Pi(alt), alpha);
  walk.Start(w.lo);
  double power = 0.0;
  for (size_t i = 0; i < w.weights.size(); ++i) {
    if (i > 0) walk.Advance();
    power += w.weights[i] * walk.g();
  }
  return std::min(power, 1.0);
}

McNemarPowerCalculator::McNemarPowerCalculator(const PairedAlternative& alt, double alpha)
    : alt_(alt), alpha_(alpha), pi_(Pi(alt)) {}

void McNemarPowerCalculator::Extend(int64_t nd_max) {
  const int64_t first = static_cast<int64_t>(g_.size());
  if (nd_max < first) return;
  ConditionalWalk walk(pi_, alpha_);
  walk.Start(first);
  for (int64_t nd = first; nd <= nd_max; ++nd) {
    if (nd > first) walk.Advance();
    const double g = walk.g();
    k_.push_back(walk.bound());
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
