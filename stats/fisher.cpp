#include "stats/fisher.h"

#include <cmath>
#include <limits>

#include "stats/conditional_or.h"

namespace twinprobe::stats {
namespace {

constexpr double kRelErr = 1 + 1e-7;  // as R's fisher.test

// The two-sided p: the tails [lo, L] and [U, hi] of outcomes no more likely
// than a. The density is unimodal, so each boundary is a binary search.
double LogTwoSidedP(const HypergeometricFamily& f, int64_t a) {
  const double threshold = f.LogDensity(a) + std::log(kRelErr);
  auto qualifies = [&](int64_t s) { return f.LogDensity(s) <= threshold; };
  const int64_t mode = f.Mode(0);
  int64_t lo = f.lo() - 1, hi = mode;  // last s in [lo, mode] that qualifies
  while (lo < hi) {
    int64_t mid = lo + (hi - lo + 1) / 2;
    if (qualifies(mid)) lo = mid;
    else hi = mid - 1;
  }
  const int64_t left = lo;
  int64_t a2 = mode + 1, b2 = f.hi() + 1;  // first s in [mode+1, hi] that qualifies
  while (a2 < b2) {
    int64_t mid = a2 + (b2 - a2) / 2;
    if (qualifies(mid)) b2 = mid;
    else a2 = mid + 1;
  }
  const int64_t right = a2;
  return LogAddExp(f.LogTail(left, false), f.LogTail(right, true));
}

}  // namespace

FisherResult FisherTest(const Table2x2& t, Alternative alternative, double conf) {
  // R: m, n = column totals, k = first-row total, x = a.
  HypergeometricFamily family(t.a + t.c, t.b + t.d, t.a + t.b);
  FisherResult r;
  r.support_lo = family.lo();
  r.support_hi = family.hi();
  switch (alternative) {
    case Alternative::kLess: r.p = PValue::FromLog(family.LogTail(t.a, false)); break;
    case Alternative::kGreater: r.p = PValue::FromLog(family.LogTail(t.a, true)); break;
    case Alternative::kTwoSided: r.p = PValue::FromLog(LogTwoSidedP(family, t.a)); break;
  }
  ConditionalEstimate e = SolveConditional(family, t.a, alternative, conf);
  r.estimate = e.estimate;
  r.ci = e.ci;
  return r;
}

SampleOddsRatio WoolfOddsRatio(const Table2x2& t, double conf) {
  constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
  const double a = static_cast<double>(t.a), b = static_cast<double>(t.b), c = static_cast<double>(t.c),
               d = static_cast<double>(t.d);
  SampleOddsRatio r;
  const double num = a * d, den = b * c;
  r.estimate = den == 0 ? (num == 0 ? kNaN : std::numeric_limits<double>::infinity()) : num / den;
  if (t.a == 0 || t.b == 0 || t.c == 0 || t.d == 0) {
    r.ci = {kNaN, kNaN};
    return r;
  }
  const double z = NormalQuantile((1 + conf) / 2);
  const double se = std::sqrt(1 / a + 1 / b + 1 / c + 1 / d);
  const double log_or = std::log(a) + std::log(d) - std::log(b) - std::log(c);
  r.ci = {std::exp(log_or - z * se), std::exp(log_or + z * se)};
  return r;
}

}  // namespace twinprobe::stats
