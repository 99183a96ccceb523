#include <catch2/catch.hpp>

#include <cmath>
#include <cstdio>
#include <functional>
#include <map>
#include <sstream>

#include "stats/contingency.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// Runs R (r-base-core, installed by scripts/setup) and returns its output.
std::string RunR(const std::string& code) {
  std::string cmd = "Rscript --vanilla -e '" + code + "' 2>/dev/null";
  FILE* pipe = popen(cmd.c_str(), "r");
  REQUIRE(pipe != nullptr);
  std::string out;
  char buf[4096];
  while (size_t n = fread(buf, 1, sizeof buf, pipe)) out.append(buf, n);
  REQUIRE(pclose(pipe) == 0);
  return out;
}

std::string RMatrix(const CountTable& t) {
  std::string cells;
  for (const auto& row : t)
    for (int64_t x : row) cells += (cells.empty() ? "" : ",") + std::to_string(x);
  return "matrix(c(" + cells + "), nrow = " + std::to_string(t.size()) + ", byrow = TRUE)";
}

double LogFactorial(int64_t n) { return std::lgamma(static_cast<double>(n) + 1); }

// Every table with these margins, with its probability under independence
// given both margins: prod r_i! prod c_j! / (n! prod x_ij!) (the slow oracle).
void EnumerateTables(const std::vector<int64_t>& rows, const std::vector<int64_t>& cols,
                     const std::function<void(const CountTable&, double)>& visit) {
  const size_t R = rows.size(), C = cols.size();
  int64_t n = 0;
  for (int64_t r : rows) n += r;
  double log_const = -LogFactorial(n);
  for (int64_t r : rows) log_const += LogFactorial(r);
  for (int64_t c : cols) log_const += LogFactorial(c);
  CountTable t(R, std::vector<int64_t>(C, 0));
  std::vector<int64_t> row_left = rows, col_left = cols;
  std::function<void(size_t)> fill = [&](size_t cell) {
    size_t i = cell / C, j = cell % C;
    if (i == R) {
      double lp = log_const;
      for (const auto& row : t)
        for (int64_t x : row) lp -= LogFactorial(x);
      visit(t, std::exp(lp));
      return;
    }
    if (j == C - 1 || i == R - 1) {  // forced by the margins
      int64_t x = j == C - 1 ? row_left[i] : col_left[j];
      if (x < 0 || x > row_left[i] || x > col_left[j]) return;
      if (i == R - 1 && j == C - 1 && row_left[i] != col_left[j]) return;
      t[i][j] = x, row_left[i] -= x, col_left[j] -= x;
      fill(cell + 1);
      row_left[i] += x, col_left[j] += x;
      return;
    }
    for (int64_t x = 0; x <= std::min(row_left[i], col_left[j]); ++x) {
      t[i][j] = x, row_left[i] -= x, col_left[j] -= x;
      fill(cell + 1);
      row_left[i] += x, col_left[j] += x;
    }
  };
  fill(0);
}

double Dhyper(int64_t x, int64_t draws, int64_t successes, int64_t population) {
  return std::exp(LogFactorial(successes) - LogFactorial(x) - LogFactorial(successes - x) +
                  LogFactorial(population - successes) - LogFactorial(draws - x) -
                  LogFactorial(population - successes - draws + x) - LogFactorial(population) +
                  LogFactorial(draws) + LogFactorial(population - draws));
}

}  // namespace

TEST_CASE("contingency: Agresti's party identification by gender table") {
  // Agresti (2007), An Introduction to Categorical Data Analysis, 2nd ed.,
  // Table 2.5 (GSS 1991): X^2 = 7.01, df = 2, P = 0.03 (from memory);
  // R 4.2 chisq.test gives 7.009543616823934, p 0.030053630547446107.
  CountTable t = {{279, 73, 225}, {165, 47, 191}};
  auto r = PearsonIndependence(t, 1);
  CHECK_THAT(r.statistic, WithinRel(7.009543616823934, 1e-12));
  CHECK(r.df == 2);
  CHECK_THAT(r.p_asymptotic, WithinRel(0.030053630547446107, 1e-9));
  CHECK_FALSE(r.small_expected);
  CHECK_FALSE(r.p_monte_carlo.has_value());
  CHECK(r.p() == r.p_asymptotic);
}

TEST_CASE("contingency: statistic and p agree with R's chisq.test, run live") {
  const std::vector<CountTable> tables = {
      {{279, 73, 225}, {165, 47, 191}},
      {{12, 5}, {7, 9}},
      {{75, 50, 76, 84, 115}, {85, 48, 67, 77, 123}},
      {{10, 2, 1, 5}, {3, 9, 8, 3}, {7, 4, 6, 12}},
      {{200, 200}, {200, 200}},
      {{1, 0, 30}, {0, 25, 2}, {14, 1, 1}},
  };
  for (const auto& t : tables) {
    std::string out = RunR("t <- suppressWarnings(chisq.test(" + RMatrix(t) +
                           ", correct = FALSE)); cat(sprintf(\"%.17g %d %.17g\", t$statistic, t$parameter, t$p.value))");
    std::istringstream in(out);
    double x2 = 0, p = 0;
    int df = 0;
    in >> x2 >> df >> p;
    REQUIRE(in);
    INFO("R says " << out);
    auto r = PearsonIndependence(t, 1, 0);
    CHECK_THAT(r.statistic, WithinAbs(x2, 1e-9 * std::max(1.0, x2)));
    CHECK(r.df == df);
    CHECK_THAT(r.p_asymptotic, WithinAbs(p, 1e-9 * std::max(1e-300, p) + 1e-15));
  }
}

TEST_CASE("contingency: a perfectly balanced table gives X^2 = 0 and p = 1") {
  auto r = PearsonIndependence({{100, 100, 100}, {100, 100, 100}}, 1);
  CHECK(r.statistic == 0);
  CHECK(r.p() == 1.0);
}

TEST_CASE("contingency: rows and columns with a zero total are left out, one column means no test") {
  auto r = PearsonIndependence({{10, 0, 5}, {0, 0, 0}, {4, 0, 9}}, 1);
  CHECK(r.df == 1);
  CHECK_THAT(r.statistic, WithinRel(PearsonStatistic({{10, 5}, {4, 9}}), 1e-15));
  auto single = PearsonIndependence({{400}, {400}}, 1);
  CHECK(single.df == 0);
  CHECK(single.p() == 1.0);
}

TEST_CASE("contingency: small expected counts switch to the Monte Carlo p, which matches exact enumeration") {
  // Small tables (expected counts well below 5): the exact conditional
  // P(X^2 >= observed | margins), by enumerating every table, is the oracle.
  const std::vector<CountTable> tables = {
      {{3, 1, 0}, {0, 2, 4}},
      {{2, 0, 1}, {0, 3, 1}, {1, 1, 4}},
      {{4, 1}, {0, 3}},
      {{1, 2, 3, 0}, {3, 1, 0, 2}},
  };
  for (const auto& t : tables) {
    auto r = PearsonIndependence(t, 2024, 20000);
    REQUIRE(r.small_expected);
    REQUIRE(r.p_monte_carlo.has_value());
    std::vector<int64_t> rows, cols(t.front().size(), 0);
    for (const auto& row : t) {
      int64_t s = 0;
      for (size_t j = 0; j < row.size(); ++j) s += row[j], cols[j] += row[j];
      rows.push_back(s);
    }
    double exact = 0, total = 0;
    EnumerateTables(rows, cols, [&](const CountTable& x, double prob) {
      total += prob;
      if (PearsonStatistic(x) >= r.statistic * (1 - 1e-12)) exact += prob;
    });
    CHECK_THAT(total, WithinAbs(1.0, 1e-9));
    // Monte Carlo standard error at B = 20000 is at most 0.0036; allow 4 of them.
    double se = std::sqrt(exact * (1 - exact) / 20000) + 1e-4;
    INFO("exact " << exact << " monte carlo " << *r.p_monte_carlo);
    CHECK(std::abs(*r.p_monte_carlo - exact) < 4 * se);
    CHECK(r.p() == *r.p_monte_carlo);
  }
}

TEST_CASE("contingency: Cochran's rule decides when the Monte Carlo p is used") {
  // 2 x 5 table, n = 40: every expected count is 4 (< 5), so the rule fails.
  auto small = PearsonIndependence({{4, 4, 4, 4, 4}, {4, 4, 4, 4, 4}}, 1, 100);
  CHECK(small.small_expected);
  CHECK(small.cells_below_5 == 10);
  // Two cells of eight below 5 (25% > 20%): the rule fails.
  auto quarter = PearsonIndependence({{20, 20, 20, 2}, {20, 20, 20, 6}}, 1, 100);
  CHECK(quarter.cells_below_5 == 2);
  CHECK(quarter.small_expected);
  // Two of ten (20%) and none below 1: the approximation stands.
  auto ok = PearsonIndependence({{20, 20, 20, 20, 4}, {20, 20, 20, 20, 5}}, 1, 100);
  CHECK(ok.cells_below_5 == 2);
  CHECK_FALSE(ok.small_expected);
}

TEST_CASE("contingency: the Monte Carlo p is reproducible from its seed") {
  CountTable t = {{3, 1, 0}, {0, 2, 4}};
  CHECK(PearsonIndependence(t, 7, 999).p_monte_carlo == PearsonIndependence(t, 7, 999).p_monte_carlo);
}

TEST_CASE("contingency: hypergeometric draws follow the exact probabilities") {
  Rng rng(11);
  const int64_t draws = 10, successes = 7, population = 20, B = 200000;
  std::map<int64_t, int64_t> count;
  for (int64_t b = 0; b < B; ++b) ++count[SampleHypergeometric(draws, successes, population, rng)];
  for (int64_t x = 0; x <= 7; ++x) {
    double p = Dhyper(x, draws, successes, population);
    double se = std::sqrt(B * p * (1 - p)) + 1;
    INFO("x = " << x << " expected " << B * p << " got " << count[x]);
    CHECK(std::abs(static_cast<double>(count[x]) - B * p) < 5 * se);
  }
  // A large urn: mean n K / N and variance n K/N (1-K/N) (N-n)/(N-1).
  double sum = 0, sum2 = 0;
  for (int b = 0; b < 20000; ++b) {
    double x = static_cast<double>(SampleHypergeometric(5000, 30000, 100000, rng));
    sum += x, sum2 += x * x;
  }
  double mean = sum / 20000, var = sum2 / 20000 - mean * mean;
  double true_var = 5000 * 0.3 * 0.7 * (95000.0 / 99999.0);
  CHECK(std::abs(mean - 1500) < 5 * std::sqrt(true_var / 20000));
  CHECK_THAT(var, WithinRel(true_var, 0.05));
  // Degenerate urns.
  CHECK(SampleHypergeometric(0, 5, 10, rng) == 0);
  CHECK(SampleHypergeometric(10, 5, 10, rng) == 5);
}

TEST_CASE("contingency: random tables keep both margins") {
  Rng rng(5);
  std::vector<int64_t> rows = {30, 2, 17, 51}, cols = {10, 40, 0, 50};
  for (int i = 0; i < 500; ++i) {
    auto t = RandomTableWithMargins(rows, cols, rng);
    for (size_t r = 0; r < rows.size(); ++r) {
      int64_t s = 0;
      for (int64_t x : t[r]) {
        REQUIRE(x >= 0);
        s += x;
      }
      REQUIRE(s == rows[r]);
    }
    for (size_t c = 0; c < cols.size(); ++c) {
      int64_t s = 0;
      for (const auto& row : t) s += row[c];
      REQUIRE(s == cols[c]);
    }
  }
}
