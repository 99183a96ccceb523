#include "stats/exact_stratified.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "stats/conditional_or.h"
#include "stats/log_density.h"

namespace twinprobe::stats {
namespace {

constexpr double kNegInf = -std::numeric_limits<double>::infinity();
constexpr double kRelErr = 1 + 1e-7;

// log of the sum of exp(v) over v (entries may be -inf).
double LogSumExp(const std::vector<double>& v) {
  double top = kNegInf;
  for (double x : v) top = std::max(top, x);
  if (top == kNegInf) return kNegInf;
  double s = 0;
  for (double x : v) s += std::exp(x - top);
  return top + std::log(s);
}

}  // namespace

std::optional<ExactStratifiedResult> ExactCommonOddsRatio(const std::vector<Table2x2>& strata,
                                                          Alternative alternative, double conf, double max_work) {
  // Work estimate first: sum over strata of (width so far) x (this width).
  double work = 0, width = 1;
  for (const auto& t : strata) {
    HypergeometricFamily f(t.a + t.c, t.b + t.d, t.a + t.b);
    double w = static_cast<double>(f.hi() - f.lo() + 1);
    work += width * w;
    width += w - 1;
  }
  if (work > max_work) return std::nullopt;

  // The convolution in log space: every entry keeps its own scale, so the far
  // tails (and so p-values below the smallest double) stay finite.
  ExactStratifiedResult r;
  std::vector<double> conv{0.0};  // log P(S = lo + i) for the strata so far
  int64_t lo = 0;
  std::vector<double> terms;
  for (const auto& t : strata) {
    const int64_t m = t.a + t.c, n = t.b + t.d, k = t.a + t.b;
    HypergeometricFamily f(m, n, k);
    std::vector<double> dens;
    for (int64_t s = f.lo(); s <= f.hi(); ++s) dens.push_back(f.LogDensity(s));
    std::vector<double> next(conv.size() + dens.size() - 1, kNegInf);
    for (size_t out = 0; out < next.size(); ++out) {
      terms.clear();
      size_t j_lo = out >= conv.size() ? out - conv.size() + 1 : 0;
      size_t j_hi = std::min(out, dens.size() - 1);
      for (size_t j = j_lo; j <= j_hi; ++j) terms.push_back(conv[out - j] + dens[j]);
      next[out] = LogSumExp(terms);
    }
    conv.swap(next);
    lo += f.lo();
    r.statistic += t.a;
  }
  // Normalise (the strata densities each sum to one; this removes rounding).
  const double total = LogSumExp(conv);
  for (double& v : conv) v -= total;
  r.support_lo = lo;
  r.support_hi = lo + static_cast<int64_t>(conv.size()) - 1;
  const size_t obs = static_cast<size_t>(r.statistic - lo);

  terms.clear();
  switch (alternative) {
    case Alternative::kLess:
      for (size_t i = 0; i <= obs; ++i) terms.push_back(conv[i]);
      break;
    case Alternative::kGreater:
      for (size_t i = obs; i < conv.size(); ++i) terms.push_back(conv[i]);
      break;
    case Alternative::kTwoSided: {
      const double threshold = conv[obs] + std::log(kRelErr);
      for (double v : conv)
        if (v <= threshold) terms.push_back(v);
      break;
    }
  }
  r.p = PValue::FromLog(LogSumExp(terms));
  TabulatedFamily family(lo, conv);
  ConditionalEstimate e = SolveConditional(family, r.statistic, alternative, conf);
  r.estimate = e.estimate;
  r.ci = e.ci;
  return r;
}

}  // namespace twinprobe::stats
