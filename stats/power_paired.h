#pragma once
// Power and sample size for the paired design (one set of two probes per
// vacancy) analysed with the two-sided exact conditional McNemar test.
//
// Notation (stats/mcnemar.h): per completed set, p10 = P(only the reference
// arm is called back) (cell b), p01 = P(only the other arm is called back)
// (cell c), psi = p10 + p01 (discordant share), delta = p10 - p01.
//
// Exact power (the definition used by SAS PROC POWER, PAIREDFREQ
// DIST=EXACT_COND, and Vuolo, Uggen & Lageson 2016): over N sets the number of
// discordant sets is nd ~ Binomial(N, psi); given nd, b ~ Binomial(nd, pi)
// with pi = p10 / psi; the test rejects when McNemarExactP(b, nd - b) <= alpha.
//   power(N) = sum_nd dbinom(nd; N, psi) * g(nd),
//   g(nd)    = P(b <= k_nd) + P(b >= nd - k_nd),  b ~ Binomial(nd, pi),
// where k_nd is the largest k with McNemarExactP(k, nd - k) <= alpha (-1 when
// no table with nd discordant sets can reject). The outer binomial weights are
// computed in log space from the mode outwards; terms whose remaining tail
// mass is below 1e-17 are left out, so each result is within 1e-16 of the full
// sum.
#include <cstdint>
#include <utility>
#include <vector>

namespace twinprobe::stats {

// The alternative, as probabilities per completed set. Requires p10 >= 0,
// p01 >= 0, 0 < p10 + p01 <= 1.
struct PairedAlternative {
  double p10 = 0;
  double p01 = 0;
  double discordant() const { return p10 + p01; }
};

// What a practitioner knows, turned into the alternative: rate_reference =
// P(reference probe called back), rate_other = P(other probe called back),
// both = P(both called back). p10 = rate_reference - both, p01 = rate_other -
// both. Requires 0 <= both <= min(rate_reference, rate_other) and
// rate_reference + rate_other - both <= 1 (the CLI checks and explains).
PairedAlternative AlternativeFromRates(double rate_reference, double rate_other, double both);

// The alternative with random losses: each planned set is lost (the vacancy
// closes before both probes are sent) with probability `lost`, independently
// of its outcome. Over N planned sets the exact power is then that of
// (1 - lost) * p10, (1 - lost) * p01. Requires 0 <= lost < 1.
PairedAlternative WithLosses(const PairedAlternative& alt, double lost);

// k_nd: the largest number of sets favouring one arm at which the two-sided
// exact McNemar test with nd discordant sets rejects at alpha (it rejects when
// b <= k_nd or b >= nd - k_nd); -1 when it cannot reject. Requires nd >= 0,
// 0 < alpha < 1.
int64_t McNemarRejectionBound(int64_t n_discordant, double alpha);

// g(nd): the probability that the test rejects given nd discordant sets, when
// each favours the reference arm with probability pi. Computed directly
// (incomplete beta); the power sums below get the same values from a faster
// walk over nd, and the tests compare the two.
double McNemarConditionalPower(int64_t n_discordant, double pi, double alpha);

// Exact power of the two-sided exact McNemar test over n_sets sets.
// Requires n_sets >= 0, 0 < alpha < 1, a valid alternative.
double McNemarExactPower(int64_t n_sets, const PairedAlternative& alt, double alpha);

// The same, for many N: keeps the conditional powers g(nd) between calls.
class McNemarPowerCalculator {
 public:
  McNemarPowerCalculator(const PairedAlternative& alt, double alpha);
  double Power(int64_t n_sets);
  // Monotone bounds used by the sample-size search: with gmax(nd) = max of g
  // over 0..nd and gmin(nd) = min of g over nd..cap, Upper(N) = E[gmax(nd)] +
  // tail and Lower(N) = E[gmin(nd)] bound power(N) and are nondecreasing in N
  // (Binomial(N+1, psi) is stochastically larger than Binomial(N, psi)).
  // Lower is valid for N whose needed nd lie below `cap` (see SetLowerCap).
  double UpperBound(int64_t n_sets);
  double LowerBound(int64_t n_sets);
  void SetLowerCap(int64_t n_sets_max);
  // Range [first, last] of nd that carries all but 1e-17 of Binomial(N, psi).
  std::pair<int64_t, int64_t> DiscordantRange(int64_t n_sets) const;

 private:
  void Extend(int64_t nd_max);
  template <typename F>
  double Expect(int64_t n_sets, F&& weight_of) const;
  PairedAlternative alt_;
  double alpha_;
  double pi_;
  std::vector<int64_t> k_;     // k_nd
  std::vector<double> g_;      // conditional power
  std::vector<double> g_max_;  // running maximum of g
  std::vector<double> g_min_;  // suffix minimum of g up to the cap
  int64_t lower_cap_ = -1;
};

// Smallest N for a target power. Exact power is not monotone in N (the
// rejection region moves in whole counts), so two numbers are reported:
//   n_first:  the smallest N with power(N) >= target;
//   n_stable: the smallest N such that power(M) >= target for every M from N
//             up to `horizon` = 2 * n_first (inclusive).
// twinprobe reports n_stable as "the" sample size (a plan that loses a few
// sets keeps its power); n_first is shown beside it.
struct ExactSampleSize {
  bool found = false;  // false when no N <= max_sets reaches the target
  int64_t n_first = 0;
  int64_t n_stable = 0;
  int64_t horizon = 0;
  double power_first = 0;
  double power_stable = 0;
};
// Requires 0 < target < 1, 0 < alpha < 1, p10 != p01.
ExactSampleSize McNemarExactSampleSize(const PairedAlternative& alt, double alpha, double target,
                                       int64_t max_sets = 10'000'000);

// Connor (1987), "Sample size for testing differences in proportions for the
// paired-sample design", Biometrics 43(1):207-211, p. 209:
//   n = [z_{1-alpha/sides} sqrt(psi) + z_{1-beta} sqrt(psi - delta^2)]^2 / delta^2,
//   power = Phi((|delta| sqrt(n) - z sqrt(psi)) / sqrt(psi - delta^2))
//           (+ the far tail Phi((-|delta| sqrt(n) - z sqrt(psi)) / sqrt(psi - delta^2))
//            when sides = 2).
// Returns the unrounded n. Requires delta != 0, sides 1 or 2.
double ConnorSampleSize(const PairedAlternative& alt, double alpha, double power, int sides = 2);
double ConnorPower(double n_sets, const PairedAlternative& alt, double alpha, int sides = 2);

// Miettinen (1968), "The matched pairs design in the case of all-or-none
// responses", Biometrics 24:339-352: as Connor with psi - delta^2 replaced by
// psi - delta^2 (3 + psi) / 4 (formula from memory; on Connor's worked example
// it gives 23.33, as R 4.2.2 does with the same formula written out).
double MiettinenSampleSize(const PairedAlternative& alt, double alpha, double power, int sides = 2);
double MiettinenPower(double n_sets, const PairedAlternative& alt, double alpha, int sides = 2);

// Minimum detectable effect for a budget of n_sets sets. With the reference
// rate and the share of sets where both are called back held fixed, the
// smallest ratio rate_reference / rate_other in (1, rate_reference / both]
// at which exact power reaches `target` (bisection on the ratio to 1e-9; the
// exact power is continuous in the ratio). Returns 0 when even the largest
// possible ratio falls short. Requires 0 < both < rate_reference < 1 or
// both == 0.
// `lost` as in WithLosses (n_sets are then planned sets).
double McNemarDetectableRatio(int64_t n_sets, double rate_reference, double both, double alpha, double target,
                              double lost = 0);
// With the discordant share psi fixed: the smallest delta = p10 - p01 in
// (0, psi] at which exact power reaches `target`; 0 when none does.
double McNemarDetectableDifference(int64_t n_sets, double discordant, double alpha, double target, double lost = 0);

}  // namespace twinprobe::stats
