#pragma once
// Tests of independence for an r x c table of counts (used for the balance
// report of a plan: arm x template, arm x send order, arm x stratum, arm x
// weekday). See docs/methods.md, "Balance of a plan".
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "stats/random.h"

namespace twinprobe::stats {

using CountTable = std::vector<std::vector<int64_t>>;  // rows of equal length, counts >= 0

struct IndependenceTest {
  // Pearson's X^2 = sum over cells (O - E)^2 / E with E = row total * column
  // total / n (Pearson 1900; Agresti 2002, section 3.2.1), without continuity
  // correction. Rows and columns whose total is 0 are left out (R's
  // chisq.test gives NaN for them instead).
  double statistic = 0;
  int df = 0;               // (rows kept - 1) * (columns kept - 1)
  double p_asymptotic = 1;  // upper tail of chi-square(df); 1 when df == 0
  int64_t n = 0;
  double min_expected = 0;
  int cells = 0;             // cells kept
  int cells_below_5 = 0;     // of them, with E < 5
  // Cochran's rule (Cochran 1954; common practice): the chi-square
  // approximation is trusted when no E < 1 and at most 20% of cells have E < 5.
  bool small_expected = false;
  // When small_expected: the conditional Monte Carlo p-value given both
  // margins, (1 + #{X*^2 >= X^2}) / (B + 1) over B tables drawn uniformly
  // among those with the observed margins (as R's chisq.test with
  // simulate.p.value = TRUE, Hope 1968; the draws differ from R's).
  std::optional<double> p_monte_carlo;
  int replicates = 0;
  // The p-value to report: Monte Carlo when small_expected, else asymptotic.
  double p() const { return p_monte_carlo ? *p_monte_carlo : p_asymptotic; }
};

// Requires a rectangular table of non-negative counts. `seed` drives the
// Monte Carlo draws (deterministic); `replicates` is B.
IndependenceTest PearsonIndependence(const CountTable& table, uint64_t seed, int replicates = 9999);

// Pearson's X^2 alone (same definition, zero rows/columns left out).
double PearsonStatistic(const CountTable& table);

// A draw from the hypergeometric distribution: successes among `draws` items
// taken without replacement from `population` items of which `successes` are
// successes. Exact inversion over the support, weights by the ratio
// recurrence from the mode. Requires 0 <= draws, successes <= population.
int64_t SampleHypergeometric(int64_t draws, int64_t successes, int64_t population, Rng& rng);

// A table drawn uniformly among the tables with these margins in the sense of
// a random permutation of the units (multivariate hypergeometric, column by
// column). Requires sum(row_totals) == sum(col_totals).
CountTable RandomTableWithMargins(const std::vector<int64_t>& row_totals, const std::vector<int64_t>& col_totals,
                                  Rng& rng);

}  // namespace twinprobe::stats
