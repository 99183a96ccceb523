#include "stats/mcnemar.h"

#include <algorithm>

#include "stats/binomial.h"

namespace twinprobe::stats {

double McNemarExactP(const PairedCounts& t) {
  int64_t n = t.discordant();
  if (n == 0) return 1.0;
  return std::min(1.0, 2.0 * BinomCdf(std::min(t.b, t.c), n, 0.5));
}

}  // namespace twinprobe::stats
