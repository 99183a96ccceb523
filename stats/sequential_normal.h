#pragma once
// Lan–DeMets spending boundaries in the normal case (a statistic whose
// increments are independent normals, e.g. a z-test on accumulating data).
// twinprobe's monitor uses the exact binomial boundaries of
// stats/sequential.h; this normal version exists so the spending functions
// and the recursion can be checked against published boundary tables and
// rpact, and so the docs can show the familiar z-scale values.
//
// Method: the recursive numerical integration of Armitage, McPherson & Rowe
// (1969, JRSS A 132:235–244; from memory), as in Jennison & Turnbull (2000), Group
// Sequential Methods with Applications to Clinical Trials, ch. 19: the
// density of the score S_k = Z_k sqrt(t_k) on the continuation region is
// carried from look to look by convolution with the N(0, t_k - t_{k-1})
// increment (Simpson's rule on a fine grid), and each symmetric boundary c_k
// is solved so that the cumulative crossing probability equals alpha(t_k)
// (two-sided, split equally; see stats/sequential.h for the spending
// functions and their two-sided convention).
#include <vector>

#include "stats/sequential.h"

namespace twinprobe::stats {

// Two-sided z-scale boundaries c_k (stop when |Z_k| >= c_k) for information
// fractions t (strictly increasing in (0, 1]). Accurate to about 1e-6.
std::vector<double> NormalSpendingBoundaries(const std::vector<double>& information, double alpha,
                                             Spending spending);

}  // namespace twinprobe::stats
