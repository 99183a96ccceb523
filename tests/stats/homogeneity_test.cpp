// Homogeneity of the discordant split across strata, against R live
// (chisq.test and fisher.test on the k x 2 table of (b_k, c_k), binom.test
// for the pooled odds ratio's interval) and against brute force.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "stats/homogeneity.h"
#include "stats/r_eval.h"
#include "stats/random.h"

using namespace twinprobe;
using namespace twinprobe::stats;
using Catch::Matchers::WithinRel;

TEST_CASE("homogeneity: chi-square, exact p and pooled odds ratio agree with R on random strata") {
  Rng rng(18);
  std::vector<std::vector<DiscordantCounts>> cases;
  for (int i = 0; i < 12; ++i) {
    std::vector<DiscordantCounts> strata;
    const int k = static_cast<int>(rng.Between(2, 6));
    for (int j = 0; j < k; ++j) strata.push_back({rng.Between(1, 15), rng.Between(0, 15)});
    cases.push_back(strata);
  }
  std::ostringstream program;
  program << "v <- c()\n";
  for (const auto& strata : cases) {
    std::ostringstream b, c;
    for (size_t j = 0; j < strata.size(); ++j) b << (j ? "," : "") << strata[j].b, c << (j ? "," : "") << strata[j].c;
    program << "b <- c(" << b.str() << "); c <- c(" << c.str() << "); t <- cbind(b, c)\n"
            << "ci <- binom.test(sum(b), sum(b) + sum(c))$conf.int\n"
            << "v <- c(v, suppressWarnings(chisq.test(t, correct = FALSE)$statistic),\n"
            << "  suppressWarnings(chisq.test(t, correct = FALSE)$p.value), fisher.test(t, workspace = 2e7)$p.value, ci / (1 - ci))\n";
  }
  program << "cat(format(v, digits = 17), sep = '\\n')\n";
  auto r = testing::RunR(program.str());
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 5 * cases.size());
  size_t i = 0;
  for (const auto& strata : cases) {
    auto h = TestDiscordantHomogeneity(strata, 0.95);
    CHECK(h.df == static_cast<int>(strata.size()) - 1);
    CHECK_THAT(h.chi2, WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(h.chi2_p.p, WithinRel(r.values[i++], 1e-9));
    REQUIRE(h.exact_p.has_value());
    // R's fisher.test for r x c tables (FEXACT) sums in its own order; 1e-7
    // is its documented relative tolerance for ties.
    CHECK_THAT(*h.exact_p, WithinRel(r.values[i++], 1e-7));
    CHECK_THAT(h.pooled_odds_ratio.ci.low, WithinRel(r.values[i++], 1e-9));
    CHECK_THAT(h.pooled_odds_ratio.ci.high, WithinRel(r.values[i++], 1e-9));
  }
}

TEST_CASE("homogeneity: the exact p is the sum over every table with the margins, by brute force") {
  // Three strata with 4, 5 and 3 discordant pairs and sum(b) = 6: every
  // (b1, b2, b3) is enumerated directly from the multivariate hypergeometric.
  const std::vector<DiscordantCounts> strata{{4, 0}, {1, 4}, {1, 2}};
  auto choose = [](int n, int k) { return std::tgamma(n + 1.0) / std::tgamma(k + 1.0) / std::tgamma(n - k + 1.0); };
  const double total = choose(12, 6), observed = choose(4, 4) * choose(5, 1) * choose(3, 1) / total;
  double p = 0;
  for (int b1 = 0; b1 <= 4; ++b1)
    for (int b2 = 0; b2 <= 5; ++b2) {
      const int b3 = 6 - b1 - b2;
      if (b3 < 0 || b3 > 3) continue;
      const double prob = choose(4, b1) * choose(5, b2) * choose(3, b3) / total;
      if (prob <= observed * (1 + 1e-7)) p += prob;
    }
  auto h = TestDiscordantHomogeneity(strata, 0.95);
  REQUIRE(h.exact_p.has_value());
  CHECK_THAT(*h.exact_p, WithinRel(p, 1e-12));
  CHECK(h.small_expected);
  CHECK(h.total_b == 6);
  CHECK(h.total_c == 6);
  CHECK(h.pooled_odds_ratio.estimate == 1.0);
}

TEST_CASE("homogeneity: strata without discordant pairs are left out") {
  auto h = TestDiscordantHomogeneity({{3, 1}, {0, 0}, {2, 5}}, 0.95);
  CHECK(h.strata_used == 2);
  CHECK(h.df == 1);
  auto one = TestDiscordantHomogeneity({{3, 1}, {0, 0}}, 0.95);
  CHECK(one.strata_used == 1);
  CHECK(std::isnan(one.chi2));
  CHECK(!one.exact_p.has_value());
  CHECK(one.pooled_odds_ratio.estimate == 3.0);
}

TEST_CASE("homogeneity: when one arm is never favoured alone every table is the observed one") {
  auto h = TestDiscordantHomogeneity({{3, 0}, {5, 0}}, 0.95);
  REQUIRE(h.exact_p.has_value());
  CHECK(*h.exact_p == 1.0);
  CHECK(std::isinf(h.pooled_odds_ratio.estimate));
}
