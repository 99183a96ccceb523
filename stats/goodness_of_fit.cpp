#include "stats/goodness_of_fit.h"

#include <boost/math/distributions/chi_squared.hpp>

namespace twinprobe::stats {

GoodnessOfFit PearsonGoodnessOfFit(const std::vector<int64_t>& observed, const std::vector<double>& expected,
                                   int constraints) {
  GoodnessOfFit g;
  for (size_t i = 0; i < observed.size(); ++i) {
    const double d = static_cast<double>(observed[i]) - expected[i];
    g.statistic += d * d / expected[i];
  }
  g.df = static_cast<int>(observed.size()) - constraints;
  if (g.df > 0) g.p = boost::math::cdf(boost::math::complement(boost::math::chi_squared(g.df), g.statistic));
  return g;
}

}  // namespace twinprobe::stats
