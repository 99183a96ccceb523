#pragma once
// McNemar's test for matched pairs.
//
// Table (one pair of probes per vacancy): a = both positive, b = reference
// arm only, c = other arm only, d = neither.
#include <cstdint>

#include "stats/pvalue.h"

namespace twinprobe::stats {

struct PairedCounts {
  int64_t a = 0, b = 0, c = 0, d = 0;
  int64_t n() const { return a + b + c + d; }
  int64_t discordant() const { return b + c; }
};

// Exact conditional McNemar test: given b + c discordant pairs, b ~
// Binomial(b + c, 1/2) under no difference; two-sided
// p = min(1, 2 * P(X <= min(b, c))). McNemar (1947), Psychometrika 12:153-157;
// the exact form as in R's exact2x2::mcnemar.exact and Fagerland, Lydersen &
// Laake (2013), BMC Med Res Methodol 13:91. Returns 1 when b + c = 0.
// Equals R's binom.test(b, b + c)$p.value (the binomial is symmetric).
double McNemarExactP(const PairedCounts& t);

struct McNemarResult {
  PValue exact;  // as McNemarExactP, with log10 when it underflows
  // Mid-p (Lancaster 1961; recommended by Fagerland et al. 2013): the exact p
  // minus P(X = min(b, c)) when b != c, and 1 - P(X = b)/2 when b == c.
  PValue mid_p;
  // Asymptotic: X^2 = (b - c)^2 / (b + c) on 1 df (McNemar 1947), and with
  // the continuity correction as R's mcnemar.test(correct = TRUE):
  // (|b - c| - 1)^2 / (b + c) when b != c, else uncorrected. Both are NaN
  // (with NaN p) when b + c = 0, as in R.
  double chi2 = 0;
  PValue chi2_p;
  double chi2_corrected = 0;
  PValue chi2_corrected_p;
};

// All four McNemar tests on one paired table. Requires counts >= 0.
McNemarResult McNemar(const PairedCounts& t);

}  // namespace twinprobe::stats
