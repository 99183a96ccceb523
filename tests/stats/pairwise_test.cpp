// Pairwise comparisons within sets: exact McNemar for every pair of levels
// and the correction over all of them, against R run live
// (tests/reference/models/klevel.R: binom.test(b, b + c) and p.adjust).
#include <catch2/catch.hpp>

#include <sstream>

#include "stats/pairwise.h"
#include "stats/r_run.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;

TEST_CASE("pairwise: every pair of 4 levels within sets agrees with R binom.test and p.adjust") {
  stats::Rng rng(31);
  std::vector<std::vector<int>> sets;
  std::ostringstream tsv;
  tsv << "a\tb\tc\td\n";
  for (int v = 0; v < 150; ++v) {
    std::vector<int> row;
    for (double r : {0.3, 0.22, 0.15, 0.28}) row.push_back(rng.Bernoulli(r) ? 1 : 0);
    tsv << row[0] << "\t" << row[1] << "\t" << row[2] << "\t" << row[3] << "\n";
    sets.push_back(row);
  }
  const auto pairs = stats::PairwiseWithin(sets, stats::Adjustment::kHommel);
  REQUIRE(pairs.size() == 6);
  CHECK((pairs[2].first == 0 && pairs[2].second == 3));
  auto r = testing::RunRScript("klevel.R", tsv.str(), "sets hommel");
  for (size_t i = 0; i < 6; ++i) {
    CHECK_THAT(pairs[i].p, WithinRel(r["pair_p"][i], 1e-9));
    CHECK_THAT(pairs[i].p_adjusted, WithinRel(r["pair_adjusted"][i], 1e-9));
    CHECK_THAT(pairs[i].difference, WithinRel(pairs[i].rate_first - pairs[i].rate_second, 1e-15));
  }
}
