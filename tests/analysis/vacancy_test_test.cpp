// The test of a factor varied between vacancies by re-assigning its levels
// to vacancies within the plan's blocks (analysis/vacancy_test.h), against
// tests/reference/models/vacancy_permutation.py: an independent python
// computation from the definition (exact enumeration of every assignment,
// or its own seeded resampling), compared within 4 Monte Carlo standard
// errors.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "analysis/vacancy_test.h"
#include "stats/r_run.h"

using namespace twinprobe;

namespace {

// Three probes a vacancy; arms 0-2 are level 0 ("f"), arms 3-5 level 1 ("m").
const std::vector<int> kArmLevel = {0, 0, 0, 1, 1, 1};

struct Vacancy {
  std::string block;
  int level;
  int positive;  // of its three probes
};

std::vector<SetOutcome> Sets(const std::vector<Vacancy>& vacancies) {
  std::vector<SetOutcome> sets;
  for (const Vacancy& v : vacancies) {
    SetOutcome s;
    for (int i = 0; i < 3; ++i) s.probes.emplace_back(v.level * 3 + i, i < v.positive);
    s.strata = {{"region", v.block}};
    sets.push_back(s);
  }
  return sets;
}

std::string Tsv(const std::vector<Vacancy>& vacancies) {
  std::ostringstream o;
  for (const Vacancy& v : vacancies) o << v.block << " " << (v.level ? "m" : "f") << " " << v.positive << "\n";
  return o.str();
}

}  // namespace

TEST_CASE("vacancy test: agrees with the exact enumeration of every assignment within blocks") {
  // 10 vacancies in two blocks: C(6,3) x C(4,2) = 120 assignments.
  const std::vector<Vacancy> v = {{"Northmere", 0, 3}, {"Northmere", 0, 2}, {"Northmere", 0, 2}, {"Northmere", 1, 0},
                                  {"Northmere", 1, 1}, {"Northmere", 1, 0}, {"Saltbridge", 0, 1}, {"Saltbridge", 0, 2},
                                  {"Saltbridge", 1, 0}, {"Saltbridge", 1, 1}};
  const VacancyPermutationTest t = TestByVacancy(Sets(v), kArmLevel, 2, {}, 20270412);
  auto py = testing::RunPythonScript("vacancy_permutation.py", Tsv(v), "0");
  REQUIRE(t.present);
  CHECK(t.vacancies == 10);
  CHECK(t.blocks == 2);
  CHECK(t.vacancies_by_level == std::vector<int64_t>{5, 5});
  CHECK(t.positive_by_level == std::vector<int64_t>{10, 2});
  // T = 10^2/5 + 2^2/5 = 20.8 (by hand and python).
  CHECK(t.statistic == Approx(20.8).epsilon(1e-12));
  CHECK(py["statistic"][0] == Approx(20.8).epsilon(1e-12));
  // python: 4 of the 120 assignments reach T, p = 1/30.
  const double exact = py["p_exact"][0];
  CHECK(exact == Approx(1.0 / 30).epsilon(1e-12));
  CHECK(t.resamples == 99'999);
  const double se = std::sqrt(exact * (1 - exact) / static_cast<double>(t.resamples));
  CHECK(std::abs(t.p - exact) <= 4 * se);
  CHECK(t.monte_carlo_se == Approx(std::sqrt(t.p * (1 - t.p) / 99'999.0)).epsilon(1e-12));
}

TEST_CASE("vacancy test: agrees with python's own resampling on 48 vacancies in two blocks") {
  // The age study's shape: 30 vacancies in Northmere, 18 in Saltbridge, half
  // of each block at each level; the positive counts follow a fixed rule
  // with more positives at level 1.
  std::vector<Vacancy> v;
  for (int i = 1; i <= 48; ++i) {
    const int level = i % 2;
    v.push_back({i <= 30 ? "Northmere" : "Saltbridge", level, (i * 7) % 3 + (level && i % 3 != 0 ? 1 : 0)});
  }
  const VacancyPermutationTest t = TestByVacancy(Sets(v), kArmLevel, 2, {}, 20270412);
  auto py = testing::RunPythonScript("vacancy_permutation.py", Tsv(v), "40000");
  REQUIRE(t.present);
  CHECK(t.vacancies_by_level == std::vector<int64_t>{24, 24});
  CHECK(t.statistic == Approx(py["statistic"][0]).epsilon(1e-12));
  const double p_py = py["p_resampled"][0], se_py = py["p_resampled"][1];
  INFO("ours " << t.p << " (se " << t.monte_carlo_se << "), python " << p_py << " (se " << se_py << ")");
  CHECK(std::abs(t.p - p_py) <= 4 * std::sqrt(t.monte_carlo_se * t.monte_carlo_se + se_py * se_py));
  // Not a trivial p: the rule was chosen so that the test is near the usual thresholds.
  CHECK(p_py > 0.001);
  CHECK(p_py < 0.5);
}

TEST_CASE("vacancy test: a block holding one level cannot change T and is not counted") {
  const std::vector<Vacancy> v = {{"Northmere", 0, 3}, {"Northmere", 1, 0}, {"Saltbridge", 0, 1}, {"Saltbridge", 0, 2}};
  const VacancyPermutationTest t = TestByVacancy(Sets(v), kArmLevel, 2, {}, 1, 999);
  REQUIRE(t.present);
  CHECK(t.vacancies == 4);
  CHECK(t.blocks == 1);
  // Swapping Northmere's two levels gives f 3 of 3 vacancies' counts and m
  // 3 of 1: T* = 3^2/3 + 3^2/1 = 12 = T (6^2/3 + 0), so every resample ties.
  CHECK(t.statistic == Approx(12).epsilon(1e-12));
  CHECK(t.p == 1.0);
  const std::vector<Vacancy> one_level = {{"Northmere", 0, 3}, {"Saltbridge", 1, 0}};
  CHECK_FALSE(TestByVacancy(Sets(one_level), kArmLevel, 2, {}, 1, 999).present);
}
