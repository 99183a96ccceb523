#pragma once
// Cochran–Armitage test for a linear trend in positive rates across ordered
// levels with scores (e.g. ages 28, 45, 58), for independent probes (an
// unpaired design, or a factor varied between vacancies).
//
// Cochran (1954), Biometrics 10:417-451; Armitage (1955), Biometrics
// 11:375-386. With x_i positives of n_i probes at score s_i, N = sum n_i,
// p = sum x_i / N and s_bar = sum n_i s_i / N:
//   X^2 = [sum_i x_i (s_i - s_bar)]^2 / (p (1 - p) sum_i n_i (s_i - s_bar)^2)
// on 1 df, exactly R's prop.trend.test(x, n, score) (which obtains it as the
// regression sum of squares of a weighted linear model). The signed z =
// sum x_i (s_i - s_bar) / sqrt(...) is positive when rates rise with the score.
#include <cstdint>
#include <vector>

namespace twinprobe::stats {

struct TrendTest {
  double statistic = 0;  // X^2 (0 when undefined, see below)
  double z = 0;          // signed root
  double p = 1;          // chi-square(1) upper tail = two-sided normal p
  bool defined = false;  // false when every probe has the same outcome or every score is the same
};

// Requires equal lengths (at least 2 levels), 0 <= x_i <= n_i.
TrendTest CochranArmitage(const std::vector<int64_t>& positives, const std::vector<int64_t>& probes,
                          const std::vector<double>& scores);

}  // namespace twinprobe::stats
