#pragma once
// Helpers shared by the power calculations (not part of the public surface).
#include <cstdint>
#include <vector>

#include <boost/math/policies/policy.hpp>

namespace twinprobe::stats::internal {

// Boost.Math evaluates double functions in long double by default; the
// power sums call the incomplete beta thousands of times, and double
// precision is all they need.
using FastPolicy = boost::math::policies::policy<boost::math::policies::promote_double<false>>;

// The probabilities of Binomial(n, p) that matter: the pmf at lo, lo+1, …,
// lo + weights.size() - 1, computed in log space from the mode outwards and
// stopped on each side once the rest of the tail is provably below
// `tail_mass` (beyond the mode the ratio of successive terms is below 1 and
// falling, so the tail is at most term * r / (1 - r)).
// Requires n >= 0, 0 <= p <= 1.
struct BinomialWeights {
  int64_t lo = 0;
  std::vector<double> weights;
  int64_t hi() const { return lo + static_cast<int64_t>(weights.size()) - 1; }
};
void FillBinomialWeights(int64_t n, double p, double tail_mass, BinomialWeights& out);

// Standard normal quantile and distribution function.
double NormalQuantile(double p);
double NormalCdf(double z);

}  // namespace twinprobe::stats::internal
