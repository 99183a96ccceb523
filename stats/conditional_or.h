#pragma once
// Conditional inference on an odds ratio psi: the family
//   P(S = s; psi) = w(s) psi^s / sum_u w(u) psi^u,  s = lo..hi,
// with w the null (psi = 1) distribution of the sufficient statistic S given
// the margins: the hypergeometric for one 2x2 table (Fisher 1935), the
// product-hypergeometric convolution for K tables with a common odds ratio
// (Mehta, Patel & Gray 1985, JASA 80:969-973). Cornfield (1956) and Gart
// (1970) give the interval by test inversion; this file is shared by
// stats/fisher.h and stats/exact_stratified.h.
//
// R's fisher.test and mantelhaen.test(exact = TRUE) solve the same equations
// with uniroot at its default tolerance (about 1e-4 on the psi or 1/psi
// scale), so their estimate and interval carry about four digits. Here the
// equations are solved by safeguarded Newton iteration on log psi to full
// double precision; tests compare with R within R's own tolerance and with an
// independent tight-tolerance solution (scipy's conditional odds ratio and
// the same equations solved in R with tol = 1e-15) to 1e-9.
#include <cstdint>
#include <vector>

#include "stats/binomial.h"

namespace twinprobe::stats {

// What an evaluation of the family at one log psi returns, for a given
// observed value x: the mean and variance of S, the tails P(S <= x) and
// P(S >= x), and their derivatives with respect to log psi.
struct FamilyAt {
  double mean = 0, var = 0;
  double lower = 0, upper = 0;    // P(S <= x), P(S >= x)
  double dlower = 0, dupper = 0;  // d/d log psi
};

class ConditionalFamily {
 public:
  virtual ~ConditionalFamily() = default;
  virtual int64_t lo() const = 0;
  virtual int64_t hi() const = 0;
  virtual FamilyAt At(double log_psi, int64_t x) const = 0;
};

// The noncentral hypergeometric family of the [1,1] cell of a 2x2 table with
// first-column total m, second-column total n and first-row total k.
// Evaluation walks outwards from the mode with the ratio of consecutive
// terms, so its cost is the width of the distribution, not of the support.
class HypergeometricFamily : public ConditionalFamily {
 public:
  HypergeometricFamily(int64_t m, int64_t n, int64_t k);
  int64_t lo() const override { return lo_; }
  int64_t hi() const override { return hi_; }
  FamilyAt At(double log_psi, int64_t x) const override;
  // The most likely value at log psi.
  int64_t Mode(double log_psi) const;
  // log P(S <= x) or log P(S >= x) at psi = 1, finite even when it
  // underflows a double.
  double LogTail(int64_t x, bool upper) const;
  // log P(S = x) at psi = 1 (R's dhyper(x, m, n, k, log = TRUE)).
  double LogDensity(int64_t x) const;

 private:
  double Ratio(int64_t s) const;  // P(s + 1) / P(s) at psi = 1
  int64_t m_, n_, k_, lo_, hi_;
};

// A family given by its null log weights on lo..hi (entries may be -inf).
class TabulatedFamily : public ConditionalFamily {
 public:
  TabulatedFamily(int64_t lo, std::vector<double> log_weights);
  int64_t lo() const override { return lo_; }
  int64_t hi() const override { return lo_ + static_cast<int64_t>(logw_.size()) - 1; }
  FamilyAt At(double log_psi, int64_t x) const override;
  const std::vector<double>& log_weights() const { return logw_; }

 private:
  int64_t lo_;
  std::vector<double> logw_;
};

// The conditional maximum-likelihood estimate of psi (E[S; psi] = x) and the
// exact interval from inverting the one-sided tests: the lower limit solves
// P(S >= x; psi) = alpha and the upper P(S <= x; psi) = alpha, with alpha =
// (1 - conf)/2 two-sided or 1 - conf for a one-sided interval ([0, upper]
// for kLess, [lower, inf] for kGreater), as R's fisher.test. x = lo gives an
// estimate and lower limit of 0, x = hi an infinite estimate and upper
// limit; lo = hi (a zero margin) gives a NaN estimate and the interval
// [0, inf]: nothing can be estimated (R returns the estimate 0 there, an
// artefact of its order of checks, with the same interval).
struct ConditionalEstimate {
  double estimate = 0;
  Interval ci;
};
ConditionalEstimate SolveConditional(const ConditionalFamily& family, int64_t x, Alternative alternative,
                                     double conf);

}  // namespace twinprobe::stats
