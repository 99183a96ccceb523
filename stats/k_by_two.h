#pragma once
// Tests of equal positive rates across k independent groups (an unpaired
// design, or a factor varied between vacancies): the k x 2 table of
// positives and negatives per group.
//
// - Pearson's chi-square on k - 1 df (Pearson 1900), without continuity
//   correction: R's chisq.test(cbind(x, n - x), correct = FALSE) (R applies
//   Yates's correction by default only to 2 x 2 tables).
// - The exact conditional test of Freeman & Halton (1951), Biometrika
//   38:141-149 (Fisher's exact test extended to k x 2): given both margins
//   the table has probability prod_i C(n_i, x_i) / C(N, S); the p-value is
//   the sum over every table with a probability at most the observed one
//   times (1 + 1e-7), R's fisher.test(cbind(x, n - x)) definition. Tables
//   are enumerated; when the bound on their number (the product of every
//   row's range but the last) exceeds kMaxKByTwoTables the exact p is left
//   out.
#include <cstdint>
#include <optional>
#include <vector>

namespace twinprobe::stats {

inline constexpr double kMaxKByTwoTables = 5e6;

struct KByTwoTest {
  double chi2 = 0;
  int df = 0;
  double p_chi2 = 1;
  double min_expected = 0;   // smallest expected count (the chi-square is doubtful below 5)
  std::optional<double> p_exact;
  double tables = 0;         // upper bound on the tables sharing the margins (see above)
};

// Requires equal lengths >= 2, n_i >= 1, 0 <= x_i <= n_i.
KByTwoTest KByTwo(const std::vector<int64_t>& positives, const std::vector<int64_t>& probes);

}  // namespace twinprobe::stats
