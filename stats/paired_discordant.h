#pragma once
// The discordant counts of one group of pairs (a stratum, or the vacancies of
// one employer): b = pairs where only the reference arm was called back,
// c = pairs where only the other arm was. Concordant pairs carry no
// information on the conditional odds ratio, so the paired analyses across
// strata and employers take these two counts alone.
#include <cstdint>

namespace twinprobe::stats {

struct DiscordantCounts {
  int64_t b = 0;
  int64_t c = 0;
  int64_t discordant() const { return b + c; }
};

}  // namespace twinprobe::stats
