#include "stats/mcnemar.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "stats/binomial.h"
#include "stats/log_density.h"

namespace twinprobe::stats {

double McNemarExactP(const PairedCounts& t) {
  int64_t n = t.discordant();
  if (n == 0) return 1.0;
  return std::min(1.0, 2.0 * BinomCdf(std::min(t.b, t.c), n, 0.5));
}

McNemarResult McNemar(const PairedCounts& t) {
  McNemarResult r;
  const int64_t n = t.discordant(), k = std::min(t.b, t.c);
  constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
  if (n == 0) {
    r.exact = r.mid_p = PValue::FromValue(1.0);
    r.chi2 = r.chi2_corrected = kNaN;
    r.chi2_p = r.chi2_corrected_p = PValue::FromLog(kNaN);
    return r;
  }
  if (t.b == t.c) {
    r.exact = PValue::FromValue(1.0);
    r.mid_p = PValue::FromValue(1.0 - 0.5 * std::exp(LogDbinom(t.b, n, 0.5)));
  } else {
    // 2 P(X <= k) in log space; the mid-p 2 P(X <= k) - P(X = k) equals
    // P(X <= k - 1) + P(X <= k), which needs no subtraction.
    r.exact = PValue::FromLog(std::log(2.0) + LogBinomTail(k, n, 0.5, false));
    r.mid_p = PValue::FromLog(LogAddExp(LogBinomTail(k - 1, n, 0.5, false), LogBinomTail(k, n, 0.5, false)));
  }
  const double diff = static_cast<double>(t.b - t.c), dn = static_cast<double>(n);
  r.chi2 = diff * diff / dn;
  r.chi2_p = ChiSquareUpper(r.chi2, 1);
  const double corrected = t.b == t.c ? 0.0 : std::abs(diff) - 1;
  r.chi2_corrected = corrected * corrected / dn;
  r.chi2_corrected_p = ChiSquareUpper(r.chi2_corrected, 1);
  return r;
}

}  // namespace twinprobe::stats
