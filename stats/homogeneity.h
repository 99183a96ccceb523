#pragma once
// Stratified analysis of matched pairs that keeps the pairing: does the
// discordant split b_k / (b_k + c_k) differ across strata, and what is the
// pooled conditional odds ratio?
//
// Under a common conditional odds ratio psi every stratum's b_k given its
// b_k + c_k discordant pairs is Binomial(b_k + c_k, psi / (1 + psi)), so
// homogeneity of psi across strata is independence in the k x 2 table of
// (b_k, c_k) (Breslow & Day 1980, Statistical Methods in Cancer Research I,
// section 7.4: for 1:1 matching the conditional likelihood is binomial on
// the discordant pairs). The Mantel–Haenszel methods on arm x outcome tables
// instead count the two probes of a vacancy as independent.
#include <cstdint>
#include <optional>
#include <vector>

#include "stats/paired.h"
#include "stats/paired_discordant.h"
#include "stats/pvalue.h"

namespace twinprobe::stats {

struct DiscordantHomogeneity {
  int strata_used = 0;  // strata with at least one discordant pair
  // Pearson's X^2 on the strata_used x 2 table of (b_k, c_k), without
  // continuity correction, on strata_used - 1 df: R's
  // chisq.test(cbind(b, c), correct = FALSE) (R's default adds Yates'
  // correction when there are exactly two strata). NaN with p = NaN when
  // fewer than two strata are used or one column is all zero.
  double chi2 = 0;
  int df = 0;
  PValue chi2_p;
  // Cochran's rule (Cochran 1954): the chi-square approximation is doubtful
  // when an expected count is below 1 or more than 20% are below 5.
  bool small_expected = false;
  // Fisher's exact test of the k x 2 table (Freeman & Halton 1951,
  // Biometrika 38:141-149): the probability, given both margins, of the
  // tables no more likely than the observed one (with R's relative fuzz
  // 1e-7), as R's fisher.test(cbind(b, c)). Empty when the enumeration
  // would visit more than kMaxExactTables tables.
  std::optional<double> exact_p;
  // The pooled conditional odds ratio sum(b) / sum(c) with the exact
  // interval of sum(b) successes in sum(b) + sum(c) trials (as
  // ConditionalOddsRatio): the conditional MLE of a common odds ratio over
  // 1:1 matched strata (Breslow & Day 1980, eq. 7.3).
  Estimate pooled_odds_ratio;
  int64_t total_b = 0, total_c = 0;
};

inline constexpr int64_t kMaxExactTables = 20'000'000;

// Requires counts >= 0 and 0 < conf < 1. Strata without discordant pairs
// carry no information and are left out.
DiscordantHomogeneity TestDiscordantHomogeneity(const std::vector<DiscordantCounts>& strata, double conf);

}  // namespace twinprobe::stats
