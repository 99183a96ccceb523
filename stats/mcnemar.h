#pragma once
// McNemar's test for matched pairs.
//
// Table (one pair of probes per vacancy): a = both positive, b = reference
// arm only, c = other arm only, d = neither.
#include <cstdint>

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
double McNemarExactP(const PairedCounts& t);

}  // namespace twinprobe::stats
