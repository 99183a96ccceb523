// End-to-end tests of `twinprobe calc` on the real binary.
#include <catch2/catch.hpp>

#include <cmath>

#include <nlohmann/json.hpp>

#include "testing/testing.h"

using twinprobe::testing::RunCli;
using Catch::Matchers::WithinRel;

TEST_CASE("calc: mcnemar --json after the subcommand gives the documented keys") {
  // Agresti's presidential approval table (Agresti 1990, Categorical Data Analysis, p. 350; R's
  // mcnemar.test help page): exact p 3.7159e-05, mid-p 2.8934e-05 (computed, binom.test in R).
  auto r = RunCli({"calc", "mcnemar", "--table", "794,150,86,570", "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK_THAT(j["p_value"].get<double>(), WithinRel(3.7159e-05, 1e-4));
  CHECK_THAT(j["mid_p_value"].get<double>(), WithinRel(2.8934e-05, 1e-4));
  CHECK_THAT(j["estimate"].get<double>(), WithinRel(150.0 / 86.0, 1e-12));
  CHECK(j["conf_int"].size() == 2);
  CHECK(j["statistic"] == 150);
}

TEST_CASE("calc: --json before the command works too, and infinity is written \"Inf\"") {
  auto r = RunCli({"--json", "calc", "mcnemar", "--table", "5,12,0,40"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["estimate"] == "Inf");
  CHECK(j["conf_int"][1] == "Inf");
}

TEST_CASE("calc: fisher on the tea-tasting table prints one sentence and the numbers") {
  // Fisher (1935), the lady tasting tea: one-sided p = 0.2429 (R's
  // fisher.test help page, alternative = "greater").
  auto r = RunCli({"calc", "fisher", "--table", "3,1,1,3", "--alternative", "greater"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("does not reject a positive rate in the reference arm no higher than the other arm's (p = 0.243)") !=
        std::string::npos);
  CHECK(r.out.find("conditional MLE odds ratio") != std::string::npos);
}

TEST_CASE("calc: mh --exact reports the exact conditional test as p_value") {
  auto r = RunCli({"calc", "mh", "--tables", "0,6,0,5;3,3,0,6;6,0,2,4;5,1,6,0;2,0,5,0", "--exact", "--json"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK_THAT(j["p_value"].get<double>(), WithinRel(0.03994490358126723, 1e-9));  // R: mantelhaen.test(exact = TRUE)
  CHECK_THAT(j["mantel_haenszel_estimate"].get<double>(), WithinRel(7.0, 1e-12));
  auto cmh = RunCli({"calc", "mh", "--tables", "0,6,0,5;3,3,0,6;6,0,2,4;5,1,6,0;2,0,5,0", "--json"});
  auto k = nlohmann::json::parse(cmh.out);
  CHECK_THAT(k["p_value"].get<double>(), WithinRel(0.047472255142918106, 1e-9));  // R: mantelhaen.test (corrected)
  CHECK(k["p_value_method"] == "Cochran-Mantel-Haenszel chi-squared with continuity correction");
}

TEST_CASE("calc: adjust keeps input order, from --p and from a file") {
  auto r = RunCli({"calc", "adjust", "--method", "holm", "--p", "0.04,0.01,0.03", "--json"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  // R: p.adjust(c(0.04, 0.01, 0.03), "holm") = 0.06 0.03 0.06
  CHECK_THAT(j["adjusted"][0].get<double>(), WithinRel(0.06, 1e-12));
  CHECK_THAT(j["adjusted"][1].get<double>(), WithinRel(0.03, 1e-12));
  twinprobe::testing::TempDir dir;
  twinprobe::testing::WriteFile(dir / "p.txt", "0.04\n0.01, 0.03\n");
  auto f = RunCli({"calc", "adjust", "--method", "holm", "--file", dir / "p.txt", "--json"});
  CHECK(nlohmann::json::parse(f.out)["adjusted"] == j["adjusted"]);
  twinprobe::testing::WriteFile(dir / "bad.txt", "0.04\n0.01 abc\n");
  auto bad = RunCli({"calc", "adjust", "--method", "holm", "--file", dir / "bad.txt"});
  CHECK(bad.exit_code == 1);
  CHECK(bad.err == "twinprobe: " + (dir / "bad.txt") + ":2: expected a number, got 'abc' \u2014 the file holds p-values in [0, 1], one or more per line\n");
}

TEST_CASE("calc: bad input gets one clear line and exit 1") {
  auto neg = RunCli({"calc", "mcnemar", "--table", "1,2,-3,4"});
  CHECK(neg.exit_code == 1);
  CHECK(neg.err == "twinprobe: --table: counts cannot be negative, got -3 \u2014 give the paired table as a,b,c,d (a both "
                   "positive, b reference only, c other only, d neither), e.g. --table 794,150,86,570\n");
  auto p = RunCli({"calc", "binom", "--x", "3", "--n", "5", "--p", "1.5"});
  CHECK(p.exit_code == 1);
  CHECK(p.err == "twinprobe: --p: a probability must lie in [0, 1], got 1.5 \u2014 give the null probability as a fraction, e.g. --p 0.5\n");
  auto list = RunCli({"calc", "adjust", "--method", "bh", "--p", "0.1,,0.2"});
  CHECK(list.exit_code == 1);
  CHECK(list.err == "twinprobe: --p: expected a number, got '' \u2014 give p-values in [0, 1] separated by commas, e.g. --p 0.01,0.04,0.2\n");
  auto tables = RunCli({"calc", "mh", "--tables", "1,2,3,4;5,6"});
  CHECK(tables.exit_code == 1);
  CHECK(tables.err.rfind("twinprobe: --tables: expected four counts a,b,c,d separated by commas, got '5,6'", 0) == 0);
  CHECK(tables.out.empty());
}

TEST_CASE("calc: a p-value below the smallest double is printed with its log10") {
  auto r = RunCli({"calc", "binom", "--x", "0", "--n", "5000"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("< 1e-16 (log10 p = -1504.8)") != std::string::npos);
  auto j = nlohmann::json::parse(RunCli({"calc", "binom", "--x", "0", "--n", "5000", "--json"}).out);
  CHECK(j["p_value"] == 0.0);
  CHECK_THAT(j["log10_p_value"].get<double>(), WithinRel(std::log10(2.0) * (1 - 5000), 1e-12));
}

TEST_CASE("calc: the paired calculators' --json carries the estimate, interval, method and p-values") {
  // Cavo et al. (2012) [[59, 6], [16, 80]], the worked example of Fagerland,
  // Lydersen & Laake (2017), Statistical Analysis of Contingency Tables,
  // ch. 8: ratio 0.8667, Bonett-Price 95% CI 0.7579 to 0.9910.
  auto ratio = nlohmann::json::parse(RunCli({"calc", "ratio", "--table", "59,6,16,80", "--json"}).out);
  CHECK_THAT(ratio["estimate"].get<double>(), WithinRel(65.0 / 75.0, 1e-15));
  CHECK_THAT(ratio["conf_int"][0].get<double>(), Catch::Matchers::WithinAbs(0.7579, 0.00005));
  CHECK_THAT(ratio["conf_int"][1].get<double>(), Catch::Matchers::WithinAbs(0.9910, 0.00005));
  CHECK(ratio["conf_int_method"] == "Bonett-Price hybrid Wilson score");
  CHECK(ratio["conf_int_sidedness"] == "two-sided");
  auto h = nlohmann::json::parse(RunCli({"calc", "homogeneity", "--strata", "3,0;1,4;5,1", "--json"}).out);
  CHECK(h["test"] == "Fisher's exact test of the strata x (b, c) table");
  CHECK(h["small_expected"] == true);
  CHECK(h["p_value"] == h["exact_p_value"]);
  CHECK(h["df"] == 2);
  CHECK(h["pooled_odds_ratio"]["estimate"] == 1.8);
  // R: binom.test(9, 14)$p.value = 0.4239501953125 (exact McNemar on the pooled pairs).
  CHECK_THAT(h["pooled_mcnemar_p_value"].get<double>(), WithinRel(0.4239501953125, 1e-12));
  auto eq = nlohmann::json::parse(RunCli({"calc", "equivalence", "--table", "59,6,16,80", "--margin", "0.1", "--json"}).out);
  CHECK(eq["equivalent"] == false);
  CHECK(eq["conf_level"] == 0.9);
  CHECK(eq["p_value"] == eq["p_value_lower"]);
  auto emp = nlohmann::json::parse(RunCli({"calc", "employers", "--employers", "10,0;1,0;1,0;0,2", "--json"}).out);
  CHECK(emp["method"] == "exact");
  CHECK(emp["statistic"] == 10);
  CHECK_THAT(emp["p_value"].get<double>(), WithinRel(10.0 / 16.0, 1e-15));
  CHECK_THAT(emp["pair_level_p_value"].get<double>(), WithinRel(212.0 / 16384.0, 1e-12));
  CHECK(emp["decisions_differ"] == true);
}
