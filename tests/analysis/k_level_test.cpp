// analysis/k_level.h on study shapes built directly: a three-level within
// factor with scores, the same with gender varied between vacancies, and an
// unpaired three-level study. Every number is checked against R run live
// (tests/stats/r_eval.h); the R call is named beside each compared value.
#include <catch2/catch.hpp>

#include <sstream>

#include "analysis/k_level.h"
#include "stats/r_eval.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

struct Pattern {
  std::vector<int> outcome;  // per level 28, 45, 58
  int count;
};

// Sets of three probes (ages 28, 45, 58) with these outcome patterns; with
// `gender`, the arms are age x gender and every set has one gender.
const std::vector<Pattern> kFemale = {{{1, 1, 1}, 10}, {{1, 0, 0}, 9}, {{1, 1, 0}, 7}, {{0, 1, 0}, 3},
                                      {{0, 0, 1}, 2},  {{1, 0, 1}, 4}, {{0, 1, 1}, 2}, {{0, 0, 0}, 30}};
const std::vector<Pattern> kMale = {{{1, 1, 1}, 8}, {{1, 0, 0}, 5}, {{1, 1, 0}, 4}, {{0, 1, 0}, 5},
                                    {{0, 0, 1}, 3}, {{1, 0, 1}, 2}, {{0, 1, 1}, 4}, {{0, 0, 0}, 25}};

KLevelFactor Age() { return {"age", {"28", "45", "58"}, "28", {28, 45, 58}, "", {}}; }

void Add(KLevelInput& in, const std::vector<Pattern>& patterns, int arm_offset) {
  for (const Pattern& p : patterns) {
    SetOutcome s;
    for (int level = 0; level < 3; ++level) s.probes.emplace_back(arm_offset + level, p.outcome[static_cast<size_t>(level)] == 1);
    s.count = p.count;
    in.sets.push_back(s);
  }
}

// R: one row per set (columns a28, a45, a58), `gender` 0/1 per row.
std::string RSets(const std::vector<Pattern>& female, const std::vector<Pattern>& male) {
  std::ostringstream o;
  o << "rows <- list(); g <- c()\n";
  auto add = [&](const std::vector<Pattern>& ps, int gender) {
    for (const Pattern& p : ps)
      o << "for (i in seq_len(" << p.count << ")) { rows[[length(rows) + 1]] <- c(" << p.outcome[0] << ", "
        << p.outcome[1] << ", " << p.outcome[2] << "); g <- c(g, " << gender << ") }\n";
  };
  add(female, 0);
  add(male, 1);
  o << "m <- do.call(rbind, rows)\n"
    << "long <- data.frame(set = rep(seq_len(nrow(m)), each = 3), y = as.vector(t(m)), age = rep(c(28, 45, 58), nrow(m)),\n"
    << "  a45 = rep(c(0, 1, 0), nrow(m)), a58 = rep(c(0, 0, 1), nrow(m)), male = rep(g, each = 3))\n";
  return o.str();
}

}  // namespace

TEST_CASE("k levels: three ages within sets against R (Cochran's Q, pairwise McNemar, clogit slope)") {
  KLevelInput in;
  in.kind = "sets";
  in.arm_labels = {"age=28", "age=45", "age=58"};
  in.factors = {Age()};
  in.correction = "holm";
  Add(in, kFemale, 0);
  const KLevelAnalysis k = AnalyzeKLevels(in);
  REQUIRE(k.present);
  REQUIRE(k.factors.size() == 1);
  const FactorAnalysis& f = k.factors[0];
  CHECK(f.within);
  REQUIRE(f.overall);
  CHECK(f.overall->method == "cochran_q");
  CHECK(f.overall->sets == 67);
  CHECK(f.overall->informative_sets == 27);
  REQUIRE(f.pairwise.size() == 3);
  CHECK(f.pairwise[0].pairs.b == 13);  // only 28: (1,0,0) 9 + (1,0,1) 4
  CHECK(f.pairwise[0].pairs.c == 5);   // only 45: (0,1,0) 3 + (0,1,1) 2
  REQUIRE(f.trend.present);
  REQUIRE(f.trend.defined);
  CHECK(f.trend.method == "clogit_slope");

  const auto r = testing::RunR(
      "suppressMessages(library(survival))\n" + RSets(kFemale, {}) +
      // Cochran (1950), Biometrika 37:256-266: Q from its definition.
      "k <- 3; C <- colSums(m); R <- rowSums(m); N <- sum(m)\n"
      "q <- (k - 1) * (k * sum(C^2) - N^2) / (k * N - sum(R^2))\n"
      "pq <- pchisq(q, k - 1, lower.tail = FALSE)\n"
      "pp <- c(); for (ij in list(c(1, 2), c(1, 3), c(2, 3))) { b <- sum(m[, ij[1]] == 1 & m[, ij[2]] == 0);\n"
      "  cc <- sum(m[, ij[1]] == 0 & m[, ij[2]] == 1); pp <- c(pp, binom.test(b, b + cc)$p.value) }\n"
      "ctl <- coxph.control(eps = 1e-14, iter.max = 100)\n"
      "fit <- clogit(y ~ age + strata(set), data = long, method = 'exact', control = ctl)\n"
      "cat(format(c(q, pq, pp, p.adjust(pp, 'holm'), coef(fit), 2 * diff(fit$loglik),\n"
      "  pchisq(2 * diff(fit$loglik), 1, lower.tail = FALSE)), digits = 17), sep = '\\n')\n");
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 11);
  // Q and its chi-square p: Cochran's definition, pchisq(q, 2, lower.tail = FALSE).
  CHECK_THAT(f.overall->statistic, WithinRel(r.values[0], 1e-12));
  CHECK_THAT(f.overall->p_asymptotic, WithinRel(r.values[1], 1e-9));
  // Pairwise: binom.test(b, b + c)$p.value, then p.adjust(p, "holm").
  for (size_t i = 0; i < 3; ++i) {
    CHECK_THAT(f.pairwise[i].p, WithinRel(r.values[2 + i], 1e-9));
    CHECK_THAT(f.pairwise[i].p_adjusted, WithinRel(r.values[5 + i], 1e-9));
  }
  // Trend: survival::clogit(y ~ age + strata(set), method = "exact"): coef and
  // the likelihood-ratio statistic 2 * diff(fit$loglik) with its pchisq p.
  CHECK_THAT(f.trend.slope, WithinRel(r.values[8], 1e-6));
  CHECK_THAT(f.trend.statistic, WithinRel(r.values[9], 1e-6));
  CHECK_THAT(f.trend.p, WithinRel(r.values[10], 1e-6));
}

TEST_CASE("k levels: exact permutation Cochran's Q on a small table against R's enumeration") {
  // Six sets, four arms (Q = 0.75 from Cochran's definition in R); the
  // exact p is R's enumeration of every arrangement
  // (tests/reference/models/klevel.R, KIND sets, ARG exact: mean(ss >= sum(C^2))).
  KLevelInput in;
  in.kind = "sets";
  in.arm_labels = {"a", "b", "c", "d"};
  const std::vector<std::vector<int>> rows = {{1, 1, 0, 1}, {0, 1, 1, 1}, {0, 0, 1, 0},
                                              {1, 1, 1, 1}, {0, 1, 0, 0}, {1, 0, 0, 1}};
  for (const auto& row : rows) {
    SetOutcome s;
    for (int a = 0; a < 4; ++a) s.probes.emplace_back(a, row[static_cast<size_t>(a)] == 1);
    in.sets.push_back(s);
  }
  const KLevelAnalysis k = AnalyzeKLevels(in);
  REQUIRE(k.present);
  const FactorAnalysis& f = k.factors[0];
  CHECK(f.name == "arm");
  REQUIRE(f.overall);
  // R, Cochran's (1950) definition: (k - 1) * (k * sum(C^2) - N^2) / (k * N - sum(R^2)) = 0.75.
  CHECK_THAT(f.overall->statistic, WithinRel(0.75, 1e-12));
  CHECK_THAT(f.overall->p_asymptotic, WithinRel(0.861385080405, 1e-9));      // R: pchisq(0.75, 3, lower.tail = FALSE)
  const auto r = testing::RunR(
      "m <- rbind(c(1,1,0,1), c(0,1,1,1), c(0,0,1,0), c(1,1,1,1), c(0,1,0,0), c(1,0,0,1)); k <- 4\n"
      "R <- rowSums(m); inf <- m[R > 0 & R < k, , drop = FALSE]\n"
      "pats <- lapply(rowSums(inf), function(r) { cm <- combn(k, r)\n"
      "  lapply(seq_len(ncol(cm)), function(c) { v <- rep(0, k); v[cm[, c]] <- 1; v }) })\n"
      "grid <- as.matrix(expand.grid(lapply(pats, seq_along))); base <- colSums(m[R == k, , drop = FALSE])\n"
      "ss <- apply(grid, 1, function(g) { tot <- base; for (i in seq_along(g)) tot <- tot + pats[[i]][[g[i]]]; sum(tot^2) })\n"
      "cat(format(mean(ss >= sum(colSums(m)^2)), digits = 17), sep = '\\n')\n");
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 1);
  REQUIRE(f.overall->p_exact);
  CHECK_THAT(*f.overall->p_exact, WithinRel(r.values[0], 1e-12));
  CHECK_THAT(f.overall->p(), WithinRel(r.values[0], 1e-12));
}

TEST_CASE("k levels: age within and gender between against R's clogit likelihood-ratio tests") {
  KLevelInput in;
  in.kind = "sets";
  in.arm_labels = {"age=28,gender=f", "age=45,gender=f", "age=58,gender=f",
                   "age=28,gender=m", "age=45,gender=m", "age=58,gender=m"};
  in.factors = {{"age", {"28", "45", "58"}, "28", {}, "", {}}, {"gender", {"f", "m"}, "f", {}, "", {}}};
  Add(in, kFemale, 0);
  Add(in, kMale, 3);
  const KLevelAnalysis k = AnalyzeKLevels(in);
  REQUIRE(k.factors.size() == 2);
  CHECK(k.factors[0].within);
  CHECK_FALSE(k.factors[1].within);
  // Gender, between vacancies: the k x 2 table of probes.
  REQUIRE(k.factors[1].overall);
  CHECK(k.factors[1].overall->method == "chi_square");
  REQUIRE(k.model.present);
  REQUIRE(k.model.failure.empty());
  REQUIRE(k.model.tests.size() == 3);
  CHECK(k.model.tests[0].name == "age");
  CHECK(k.model.tests[0].df == 2);
  CHECK_FALSE(k.model.tests[1].estimable);
  CHECK(k.model.tests[1].note ==
        "varied between vacancies, so constant within every set: tested by re-assigning its levels to vacancies");
  CHECK(k.model.tests[2].name == "age x gender");
  CHECK(k.model.tests[2].df == 2);
  REQUIRE(k.model.terms.size() == 4);
  CHECK(k.model.terms[0].name == "age=45");
  CHECK(k.model.terms[3].name == "age=58 x gender=m");

  const auto r = testing::RunR(
      "suppressMessages(library(survival))\n" + RSets(kFemale, kMale) +
      "ctl <- coxph.control(eps = 1e-14, iter.max = 100)\n"
      "main <- clogit(y ~ a45 + a58 + strata(set), data = long, method = 'exact', control = ctl)\n"
      "full <- clogit(y ~ a45 + a58 + a45:male + a58:male + strata(set), data = long, method = 'exact', control = ctl)\n"
      "la <- 2 * diff(main$loglik); li <- 2 * (full$loglik[2] - main$loglik[2])\n"
      "cat(format(c(la, pchisq(la, 2, lower.tail = FALSE), li, pchisq(li, 2, lower.tail = FALSE), exp(coef(main)),\n"
      "  exp(coef(full)[3:4]), chisq.test(cbind(c(sum(m[g == 0, ]), sum(m[g == 1, ])), c(sum(1 - m[g == 0, ]),\n"
      "  sum(1 - m[g == 1, ]))), correct = FALSE)$p.value), digits = 17), sep = '\\n')\n");
  REQUIRE(r.ok);
  INFO(r.error);
  REQUIRE(r.values.size() == 9);
  // Main effect of age: 2 * diff(main$loglik) on 2 df (clogit, method = "exact").
  CHECK_THAT(k.model.tests[0].statistic, WithinRel(r.values[0], 1e-6));
  CHECK_THAT(k.model.tests[0].p, WithinRel(r.values[1], 1e-6));
  // Interaction: 2 * (full$loglik[2] - main$loglik[2]) on 2 df.
  CHECK_THAT(k.model.tests[2].statistic, WithinRel(r.values[2], 1e-6));
  CHECK_THAT(k.model.tests[2].p, WithinRel(r.values[3], 1e-6));
  // Odds ratios: exp(coef(main)) and exp(coef(full)[3:4]).
  CHECK_THAT(k.model.terms[0].odds_ratio, WithinRel(r.values[4], 1e-6));
  CHECK_THAT(k.model.terms[1].odds_ratio, WithinRel(r.values[5], 1e-6));
  CHECK_THAT(k.model.terms[2].odds_ratio, WithinRel(r.values[6], 1e-6));
  CHECK_THAT(k.model.terms[3].odds_ratio, WithinRel(r.values[7], 1e-6));
  // Gender: chisq.test(cbind(x, n - x), correct = FALSE)$p.value on the probes.
  CHECK_THAT(k.factors[1].overall->p_asymptotic, WithinRel(r.values[8], 1e-9));
}

TEST_CASE("k levels: an unpaired three-level study against R (chisq.test, fisher.test, prop.trend.test)") {
  KLevelInput in;
  in.kind = "unpaired";
  in.arm_labels = {"age=28", "age=45", "age=58"};
  in.factors = {Age()};
  in.correction = "bonferroni";
  const int positives[] = {15, 10, 5};
  for (int arm = 0; arm < 3; ++arm) {
    in.sets.push_back({{{arm, true}}, {}, positives[arm]});
    in.sets.push_back({{{arm, false}}, {}, 50 - positives[arm]});
  }
  const KLevelAnalysis k = AnalyzeKLevels(in);
  const FactorAnalysis& f = k.factors[0];
  CHECK_FALSE(f.within);
  REQUIRE(f.overall);
  REQUIRE(f.trend.present);
  CHECK(f.trend.method == "cochran_armitage");
  // prop.trend.test(c(15, 10, 5), c(50, 50, 50), c(28, 45, 58)): X-squared = 6.2131811, p = 0.01268026 (R 4.2).
  CHECK_THAT(f.trend.statistic, WithinRel(6.2131811, 1e-7));
  CHECK_THAT(f.trend.p, WithinRel(0.01268026, 1e-6));
  CHECK(f.trend.z < 0);
  const auto r = testing::RunR(
      "x <- c(15, 10, 5); n <- c(50, 50, 50); tab <- cbind(x, n - x)\n"
      "pp <- c(); for (ij in list(c(1, 2), c(1, 3), c(2, 3))) pp <- c(pp, fisher.test(tab[ij, ])$p.value)\n"
      "cat(format(c(chisq.test(tab, correct = FALSE)$statistic, chisq.test(tab, correct = FALSE)$p.value,\n"
      "  fisher.test(tab)$p.value, pp, p.adjust(pp, 'bonferroni')), digits = 17), sep = '\\n')\n");
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 9);
  CHECK_THAT(f.overall->statistic, WithinRel(r.values[0], 1e-12));   // chisq.test(tab, correct = FALSE)$statistic
  CHECK_THAT(f.overall->p_asymptotic, WithinRel(r.values[1], 1e-9));  // chisq.test(...)$p.value
  REQUIRE(f.overall->p_exact);
  CHECK_THAT(*f.overall->p_exact, WithinRel(r.values[2], 1e-9));      // fisher.test(tab)$p.value
  for (size_t i = 0; i < 3; ++i) {
    CHECK_THAT(f.pairwise[i].p, WithinRel(r.values[3 + i], 1e-9));          // fisher.test(tab[ij, ])$p.value
    CHECK_THAT(f.pairwise[i].p_adjusted, WithinRel(r.values[6 + i], 1e-9)); // p.adjust(pp, "bonferroni")
  }
}

TEST_CASE("k levels: one two-level factor is left to the paired effects") {
  KLevelInput in;
  in.arm_labels = {"origin=coastal", "origin=inland"};
  in.factors = {{"origin", {"coastal", "inland"}, "coastal", {}, "", {}}};
  in.sets.push_back({{{0, true}, {1, false}}, {}, 3});
  CHECK_FALSE(AnalyzeKLevels(in).present);
  CHECK(LevelOfArm("age=45,gender=m", "gender") == "m");
  CHECK(LevelOfArm("age=45,gender=m", "origin").empty());
}

TEST_CASE("k levels: two factors both within sets are each tested on blocks of one set and one level of the other, against R") {
  // Six probes a set: ages 28, 45, 58 of a woman (arms 0-2) and of a man
  // (arms 3-5); set j has kFemale[j]'s outcomes for the woman's probes and
  // kMale[j + 1]'s (cyclically) for the man's, kFemale[j].count times.
  KLevelInput in;
  in.kind = "sets";
  in.arm_labels = {"age=28,gender=f", "age=45,gender=f", "age=58,gender=f",
                   "age=28,gender=m", "age=45,gender=m", "age=58,gender=m"};
  in.factors = {{"age", {"28", "45", "58"}, "28", {}, "", {}}, {"gender", {"f", "m"}, "f", {}, "", {"woman", "man"}}};
  std::ostringstream r_rows;  // R: m rows (set, gender) x ages, h rows (set, age) x genders
  r_rows << "m <- NULL; h <- NULL\n";
  for (size_t j = 0; j < kFemale.size(); ++j) {
    SetOutcome s;
    const auto& f = kFemale[j].outcome;
    const auto& m = kMale[(j + 1) % kMale.size()].outcome;
    for (int level = 0; level < 3; ++level) {
      s.probes.emplace_back(level, f[static_cast<size_t>(level)] == 1);
      s.probes.emplace_back(3 + level, m[static_cast<size_t>(level)] == 1);
    }
    s.count = kFemale[j].count;
    in.sets.push_back(s);
    r_rows << "for (i in seq_len(" << s.count << ")) { m <- rbind(m, c(" << f[0] << ", " << f[1] << ", " << f[2]
           << "), c(" << m[0] << ", " << m[1] << ", " << m[2] << ")); h <- rbind(h, c(" << f[0] << ", " << m[0]
           << "), c(" << f[1] << ", " << m[1] << "), c(" << f[2] << ", " << m[2] << ")) }\n";
  }
  const KLevelAnalysis k = AnalyzeKLevels(in);
  REQUIRE(k.factors.size() == 2);
  const FactorAnalysis& age = k.factors[0];
  const FactorAnalysis& gender = k.factors[1];
  CHECK(age.within);
  CHECK(gender.within);
  REQUIRE(age.overall);
  REQUIRE(gender.overall);
  CHECK(age.overall->method == "cochran_q");
  CHECK(age.overall->blocks_by == "gender");
  CHECK(gender.overall->blocks_by == "age");
  CHECK(age.overall->sets == 2 * 67);     // a row of ages per set and gender
  CHECK(gender.overall->sets == 3 * 67);  // a pair of genders per set and age
  CHECK(gender.pairwise.size() == 1);
  CHECK(gender.pairwise[0].first_label == "woman");
  CHECK_FALSE(gender.vacancy_test.present);  // varied within: no vacancy re-assignment
  REQUIRE(k.model.present);
  CHECK(k.model.tests[1].estimable);

  const auto r = testing::RunR(
      r_rows.str() +
      // Cochran (1950), Biometrika 37:256-266: Q from its definition on the rows.
      "cq <- function(x) { k <- ncol(x); C <- colSums(x); R <- rowSums(x); N <- sum(x)\n"
      "  q <- (k - 1) * (k * sum(C^2) - N^2) / (k * N - sum(R^2)); c(q, pchisq(q, k - 1, lower.tail = FALSE)) }\n"
      "pp <- c(); for (ij in list(c(1, 2), c(1, 3), c(2, 3))) { b <- sum(m[, ij[1]] == 1 & m[, ij[2]] == 0);\n"
      "  cc <- sum(m[, ij[1]] == 0 & m[, ij[2]] == 1); pp <- c(pp, binom.test(b, b + cc)$p.value) }\n"
      "bg <- sum(h[, 1] == 1 & h[, 2] == 0); cg <- sum(h[, 1] == 0 & h[, 2] == 1)\n"
      "cat(format(c(cq(m), pp, p.adjust(pp, 'holm'), cq(h), binom.test(bg, bg + cg)$p.value), digits = 17), sep = '\\n')\n");
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 11);
  // Age: Q and pchisq(q, 2, lower.tail = FALSE) on the (set, gender) rows.
  CHECK_THAT(age.overall->statistic, WithinRel(r.values[0], 1e-12));
  CHECK_THAT(age.overall->p_asymptotic, WithinRel(r.values[1], 1e-9));
  // Age pairs: binom.test(b, b + c)$p.value on those rows, then p.adjust(p, "holm").
  for (size_t i = 0; i < 3; ++i) {
    CHECK_THAT(age.pairwise[i].p, WithinRel(r.values[2 + i], 1e-9));
    CHECK_THAT(age.pairwise[i].p_adjusted, WithinRel(r.values[5 + i], 1e-9));
  }
  // Gender: Q (McNemar's uncorrected chi-square for two levels) on the
  // (set, age) rows, and binom.test(b, b + c)$p.value.
  CHECK_THAT(gender.overall->statistic, WithinRel(r.values[8], 1e-12));
  CHECK_THAT(gender.overall->p_asymptotic, WithinRel(r.values[9], 1e-9));
  CHECK_THAT(gender.pairwise[0].p, WithinRel(r.values[10], 1e-9));
}
