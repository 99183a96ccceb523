#pragma once
// The rate difference between two independent groups (an unpaired design,
// or a factor varied between vacancies) with Newcombe's hybrid score
// interval: method 10 of Newcombe (1998), "Interval estimation for the
// difference between independent proportions: comparison of eleven
// methods", Statistics in Medicine 17:873-890. With p_i = x_i / n_i and
// Wilson (1927) score limits (l_i, u_i) for each rate (stats/binomial.h):
//   D = p1 - p2,
//   L = D - sqrt((p1 - l1)^2 + (u2 - p2)^2),
//   U = D + sqrt((u1 - p1)^2 + (p2 - l2)^2).
// Recommended by Fagerland, Lydersen & Laake (2015), Stat Methods Med Res
// 24:224-254. Same as statsmodels' confint_proportions_2indep(method =
// "newcomb", compare = "diff"). (The paired version is
// NewcombePairedDifference in stats/paired.h.)
#include <cstdint>

#include "stats/binomial.h"

namespace twinprobe::stats {

struct RateDifference {
  double rate_first = 0, rate_second = 0;
  double difference = 0;  // rate_first - rate_second
  Interval ci;            // within [-1, 1]
};

// Requires 0 <= x_i <= n_i, n_i >= 1, 0 < conf < 1.
RateDifference NewcombeDifference(int64_t x1, int64_t n1, int64_t x2, int64_t n2, double conf);

}  // namespace twinprobe::stats
