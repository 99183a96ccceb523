// Cochran's Q against R computing it from its definition (Cochran 1950,
// Biometrika 37:256-266), run live by tests/reference/models/klevel.R, with
// the exact permutation p against R listing every arrangement.
#include <catch2/catch.hpp>

#include <sstream>

#include "stats/cochran_q.h"
#include "stats/mcnemar.h"
#include "stats/r_run.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

std::vector<std::vector<int>> DrawSets(uint64_t seed, int vacancies, std::vector<double> rates) {
  stats::Rng rng(seed);
  std::vector<std::vector<int>> sets;
  for (int v = 0; v < vacancies; ++v) {
    const double lift = rng.Bernoulli(0.3) ? 0.3 : 0.0;  // some vacancies call back more of everyone
    std::vector<int> row;
    for (double r : rates) row.push_back(rng.Bernoulli(r + lift) ? 1 : 0);
    sets.push_back(row);
  }
  return sets;
}

std::string Tsv(const std::vector<std::vector<int>>& sets) {
  std::ostringstream o;
  for (size_t j = 0; j < sets[0].size(); ++j) o << (j ? "\t" : "") << "arm" << j;
  o << "\n";
  for (const auto& row : sets) {
    for (size_t j = 0; j < row.size(); ++j) o << (j ? "\t" : "") << row[j];
    o << "\n";
  }
  return o.str();
}

}  // namespace

TEST_CASE("cochran q: 6 sets of 4 arms, Q and p from the definition") {
  // Computed by hand from Cochran's (1950) formula: C = (3, 4, 3, 4), R = (3,
  // 3, 1, 4, 1, 2), N = 14: Q = 3 (4 * 50 - 196) / (4 * 14 - 40) = 0.75; p =
  // pchisq(0.75, 3, lower.tail = FALSE) = 0.861385080405 (R, run below).
  const std::vector<std::vector<int>> sets = {{1, 1, 0, 1}, {0, 1, 1, 1}, {0, 0, 1, 0},
                                              {1, 1, 1, 1}, {0, 1, 0, 0}, {1, 0, 0, 1}};
  const auto q = stats::CochranQTest(sets);
  CHECK_THAT(q.statistic, WithinRel(0.75, 1e-14));
  CHECK(q.df == 3);
  CHECK(q.informative_sets == 5);
  auto r = testing::RunRScript("klevel.R", Tsv(sets), "sets exact");
  CHECK_THAT(q.p_asymptotic, WithinRel(r["p"][0], 1e-10));
  CHECK_THAT(q.p_asymptotic, WithinRel(0.861385080405, 1e-11));
  REQUIRE(q.p_exact);
  CHECK_THAT(*q.p_exact, WithinRel(r["p_exact"][0], 1e-12));  // R: mean over every arrangement
}

TEST_CASE("cochran q: the NAG Library's G08ALF worked example") {
  // NAG Library Manual (Mark 26.2), routine G08ALF, example program results:
  // 12 blocks x 3 treatments, "Cochrans Q test statistic = 2.8000, Degrees of
  // freedom = 2.0, Upper-tail probability = 0.2466".
  const std::vector<std::vector<int>> sets = {{1, 1, 1}, {1, 1, 1}, {0, 1, 0}, {1, 1, 0}, {0, 0, 0}, {1, 1, 1},
                                              {1, 1, 1}, {1, 1, 0}, {0, 0, 1}, {0, 1, 0}, {1, 1, 1}, {1, 1, 1}};
  const auto q = stats::CochranQTest(sets);
  CHECK_THAT(q.statistic, WithinAbs(2.8, 5e-5));
  CHECK(q.df == 2);
  CHECK_THAT(q.p_asymptotic, WithinAbs(0.2466, 5e-5));
  CHECK(q.positives == std::vector<int64_t>{8, 10, 7});
}

TEST_CASE("cochran q: small 3-arm tables, exact permutation p agrees with R listing every arrangement") {
  for (uint64_t seed : {1, 2, 3, 4}) {
    const auto sets = DrawSets(seed, 12, {0.2, 0.35, 0.5});
    const auto q = stats::CochranQTest(sets);
    auto r = testing::RunRScript("klevel.R", Tsv(sets), "sets exact");
    INFO("seed " << seed);
    CHECK_THAT(q.statistic, WithinRel(r["q"][0], 1e-12) || WithinAbs(r["q"][0], 1e-14));
    CHECK_THAT(q.p_asymptotic, WithinRel(r["p"][0], 1e-10));
    REQUIRE(q.p_exact);
    CHECK_THAT(*q.p_exact, WithinRel(r["p_exact"][0], 1e-12));
  }
}

TEST_CASE("cochran q: 300 vacancies of 3 arms agree with R's definition") {
  const auto sets = DrawSets(77, 300, {0.15, 0.1, 0.07});
  const auto q = stats::CochranQTest(sets);
  auto r = testing::RunRScript("klevel.R", Tsv(sets), "sets holm");
  CHECK_THAT(q.statistic, WithinRel(r["q"][0], 1e-12));
  CHECK_THAT(q.p_asymptotic, WithinRel(r["p"][0], 1e-10));
}

TEST_CASE("cochran q: a large table leaves the exact p out and keeps the asymptotic one") {
  const auto q = stats::CochranQTest(DrawSets(12, 1000, {0.3, 0.25, 0.2}));
  CHECK_FALSE(q.p_exact);
  CHECK(q.p_asymptotic < 1);
  CHECK(q.informative_sets > 300);
}

TEST_CASE("cochran q: with two arms Q is McNemar's uncorrected statistic") {
  const auto sets = DrawSets(8, 200, {0.3, 0.2});
  stats::PairedCounts t;
  for (const auto& row : sets) (row[0] && row[1] ? t.a : row[0] ? t.b : row[1] ? t.c : t.d)++;
  CHECK_THAT(stats::CochranQTest(sets, false).statistic, WithinRel(stats::McNemar(t).chi2, 1e-12));
}

TEST_CASE("cochran q: no informative set gives Q = 0 and p = 1") {
  const auto q = stats::CochranQTest({{1, 1, 1}, {0, 0, 0}});
  CHECK(q.statistic == 0);
  CHECK(q.p_asymptotic == 1);
  CHECK(q.p_exact == 1.0);
}
