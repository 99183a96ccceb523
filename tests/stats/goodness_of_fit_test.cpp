// Pearson's goodness-of-fit test (stats/goodness_of_fit.h) against scipy,
// run live: scipy.stats.chisquare(f_obs, f_exp, ddof).
#include <catch2/catch.hpp>

#include <cstdlib>
#include <sstream>

#include "stats/goodness_of_fit.h"
#include "testing/testing.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;

namespace {

// Runs python3 with scipy on the counts; returns "statistic p".
std::pair<double, double> Scipy(const std::string& observed, const std::string& expected, int ddof) {
  testing::TempDir dir;
  const std::string script = dir / "fit.py";
  testing::WriteFile(script, "from scipy.stats import chisquare\n"
                             "r = chisquare(" + observed + ", " + expected + ", ddof=" + std::to_string(ddof) + ")\n"
                             "print('%.17g %.17g' % (r.statistic, r.pvalue))\n");
  const std::string out_path = dir / "out.txt";
  REQUIRE(std::system(("/usr/bin/python3 " + script + " > " + out_path).c_str()) == 0);
  std::istringstream in(testing::ReadFile(out_path));
  double statistic = 0, p = 0;
  in >> statistic >> p;
  return {statistic, p};
}

}  // namespace

TEST_CASE("goodness of fit: one group of six ordered pairs agrees with scipy.stats.chisquare") {
  auto g = stats::PearsonGoodnessOfFit({7, 9, 8, 10, 6, 8}, {8, 8, 8, 8, 8, 8}, 1);
  // By hand: (1 + 1 + 0 + 4 + 4 + 0) / 8 = 1.25 on 5 df.
  CHECK(g.statistic == 1.25);
  CHECK(g.df == 5);
  auto [statistic, p] = Scipy("[7, 9, 8, 10, 6, 8]", "[8, 8, 8, 8, 8, 8]", 0);
  CHECK_THAT(g.statistic, WithinRel(statistic, 1e-12));
  CHECK_THAT(g.p, WithinRel(p, 1e-9));
}

TEST_CASE("goodness of fit: two groups fitted to their own totals agree with scipy's ddof") {
  // Group one: 4 cells of 20 pairs (E = 5); group two: 2 cells of 9 (E = 4.5).
  auto g = stats::PearsonGoodnessOfFit({3, 6, 5, 6, 4, 5}, {5, 5, 5, 5, 4.5, 4.5}, 2);
  CHECK(g.df == 4);
  auto [statistic, p] = Scipy("[3, 6, 5, 6, 4, 5]", "[5, 5, 5, 5, 4.5, 4.5]", 1);
  CHECK_THAT(g.statistic, WithinRel(statistic, 1e-12));
  CHECK_THAT(g.p, WithinRel(p, 1e-9));
}

TEST_CASE("goodness of fit: counts equal to their expectation give X2 = 0 and p = 1") {
  auto g = stats::PearsonGoodnessOfFit({4, 4, 4}, {4, 4, 4}, 1);
  CHECK(g.statistic == 0.0);
  CHECK(g.p == 1.0);
}
