// End-to-end tests of `twinprobe power` (the real binary).
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "stats/power_fisher.h"
#include "stats/power_paired.h"
#include "stats/power_sets.h"
#include "stats/power_unpaired.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("power cli: paired sample size from the practitioner's rates, text and JSON") {
  // 10% vs 7% callbacks, both called back at 5%: p10 = 0.05, p01 = 0.02.
  auto r = RunCli({"--json", "power", "paired", "--rate", "0.10", "--difference", "0.03", "--both", "0.05", "--power",
                   "0.8"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["n"] == 645);
  CHECK(j["n_first"] == 645);
  CHECK(j["horizon"] == 1290);
  CHECK(j["applications"] == 1290);
  CHECK_THAT(j["p10"].get<double>(), WithinAbs(0.05, 1e-12));
  CHECK_THAT(j["p01"].get<double>(), WithinAbs(0.02, 1e-12));
  CHECK_THAT(j["connor"]["n"].get<double>(), WithinAbs(608.1, 0.05));  // Connor (1987) formula in R 4.2.2: 608.105
  CHECK(j["connor"]["n_rounded"] == 609);
  CHECK_THAT(j["miettinen"]["n"].get<double>(), WithinAbs(608.7, 0.05));
  CHECK(j["table"].size() == 8);

  auto text = RunCli({"power", "paired", "--rate", "0.10", "--ratio", "1.4285714285714286", "--both", "0.05", "--power",
                      "0.8"});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("To show this gap with 80% power at the 5% level, test 645 vacancies with a pair of probes each "
                      "(1,290 applications).") != std::string::npos);
  CHECK(text.out.find("Connor (1987) 609 (608.1), Miettinen (1968) 609 (608.7)") != std::string::npos);
}

TEST_CASE("power cli: paired power for a given number of vacancies, with losses and comparisons") {
  auto r = RunCli({"--json", "power", "paired", "--p10", "0.05", "--p01", "0.02", "--pairs", "700", "--lost", "0.1",
                   "--comparisons", "2"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["alpha_per_comparison"] == 0.025);
  stats::PairedAlternative alt{0.05, 0.02};
  CHECK_THAT(j["power"].get<double>(),
             WithinRel(stats::McNemarExactPower(700, stats::WithLosses(alt, 0.1), 0.025), 1e-12));
  CHECK_THAT(j["connor"]["power"].get<double>(), WithinRel(stats::ConnorPower(630, alt, 0.025), 1e-12));
  CHECK(j["miettinen"].contains("power"));
}

TEST_CASE("power cli: smallest detectable ratio for a budget") {
  auto r =
      RunCli({"--json", "power", "paired", "--rate", "0.10", "--both", "0.05", "--pairs", "600", "--power", "0.8"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK_THAT(j["detectable_ratio"].get<double>(),
             WithinRel(stats::McNemarDetectableRatio(600, 0.10, 0.05, 0.05, 0.8), 1e-12));
  CHECK(j["power"].get<double>() >= 0.8);
}

TEST_CASE("power cli: unpaired as R's power.prop.test, with an SVG power curve") {
  testing::TempDir dir;
  auto r = RunCli({"--json", "power", "unpaired", "--p1", "0.10", "--p2", "0.07", "--power", "0.8", "--plot",
                   dir / "curve.svg"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["n"] == 1356);  // R 4.2.2 power.prop.test(p1 = 0.10, p2 = 0.07, power = 0.8)$n = 1355.37
  CHECK_THAT(j["n_unrounded"].get<double>(),
             WithinRel(stats::NormalTwoProportionSampleSize(0.1, 0.07, 0.05, 0.8), 1e-12));
  std::string svg = testing::ReadFile(dir / "curve.svg");
  CHECK(svg.rfind("<svg xmlns=\"http://www.w3.org/2000/svg\"", 0) == 0);
  CHECK(svg.find("<title>Power for callback rates 10.0% vs 7.0% (alpha 0.05)</title>") != std::string::npos);
  CHECK(svg.find(">Vacancies per arm (one probe each)</text>") != std::string::npos);
  CHECK(svg.find(">Power</text>") != std::string::npos);
  CHECK(svg.find("<polyline") != std::string::npos);
  CHECK(svg.find("<script") == std::string::npos);

  auto p = RunCli({"--json", "power", "unpaired", "--p1", "0.10", "--p2", "0.07", "--n", "1000"});
  REQUIRE(p.exit_code == 0);
  CHECK_THAT(nlohmann::json::parse(p.out)["power"].get<double>(),
             WithinRel(stats::NormalTwoProportionPower(1000, 0.10, 0.07, 0.05), 1e-12));
}

TEST_CASE("power cli: unpaired --exact gives Fisher's exact power beside the normal approximation") {
  auto r = RunCli({"--json", "power", "unpaired", "--p1", "0.5", "--p2", "0.2", "--n", "40", "--exact"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK_THAT(j["power"].get<double>(), WithinRel(stats::FisherExactPower(40, 0.5, 0.2, 0.05), 1e-12));
  CHECK_THAT(j["normal"]["power"].get<double>(), WithinRel(stats::NormalTwoProportionPower(40, 0.5, 0.2, 0.05), 1e-12));
  CHECK(j["power"].get<double>() < j["normal"]["power"].get<double>());  // Fisher is conservative

  auto n = RunCli({"--json", "power", "unpaired", "--p1", "0.5", "--p2", "0.2", "--power", "0.8", "--exact"});
  REQUIRE(n.exit_code == 0);
  auto jn = nlohmann::json::parse(n.out);
  const int64_t size = jn["n"].get<int64_t>();
  CHECK(stats::FisherExactPower(size, 0.5, 0.2, 0.05) >= 0.8);
  CHECK(stats::FisherExactPower(size - 1, 0.5, 0.2, 0.05) < 0.8);
  CHECK(jn["normal"]["n"] == 39);  // R: ceiling(power.prop.test(p1 = .5, p2 = .2, power = .8)$n) = 39

  auto mde = RunCli({"power", "unpaired", "--p1", "0.5", "--n", "40", "--power", "0.8", "--exact"});
  CHECK(mde.exit_code == 2);
  CHECK(mde.err == "twinprobe: --exact is not available for the smallest detectable p2 \u2014 leave out --exact "
                   "(normal approximation), or try candidate values with --p2 and --n\n");
}

TEST_CASE("power cli: the paired plot has the exact and Connor curves") {
  testing::TempDir dir;
  auto r = RunCli({"power", "paired", "--p10", "0.05", "--p01", "0.02", "--pairs", "600", "--plot", dir / "p.svg"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.err == "Power curve written to " + (dir / "p.svg") + "\n");
  std::string svg = testing::ReadFile(dir / "p.svg");
  CHECK(svg.find(">exact McNemar</text>") != std::string::npos);
  CHECK(svg.find(">Connor (1987)</text>") != std::string::npos);
  CHECK(svg.find(">Vacancies (sets of two probes)</text>") != std::string::npos);
}

TEST_CASE("power cli: impossible inputs give one clear error line and exit 1") {
  struct Case {
    std::vector<std::string> args;
    std::string err;
  };
  const std::vector<Case> cases = {
      {{"power", "paired", "--p10", "0.05", "--p01", "0.02", "--power", "1"},
       "twinprobe: --power: the target power must be between 0 and 1 (exclusive), got 1 \u2014 use e.g. --power 0.8\n"},
      {{"power", "paired", "--rate", "1.2", "--ratio", "1.5", "--both", "0.1", "--power", "0.8"},
       "twinprobe: --rate: a callback rate must be between 0 and 1 (exclusive), got 1.2 \u2014 use e.g. --rate 0.12\n"},
      {{"power", "paired", "--rate", "0.3", "--ratio", "0.2", "--both", "0.1", "--power", "0.8"},
       "twinprobe: --ratio: a ratio of 0.2 makes the other arm's callback rate 1.5, not below 1 \u2014 use a ratio "
       "above 0.3 (the reference rate)\n"},
      {{"power", "paired", "--rate", "0.1", "--ratio", "2", "--both", "0.08", "--power", "0.8"},
       "twinprobe: --both: 0.08 of vacancies calling back both probes is more than the lower callback rate 0.05 "
       "\u2014 --both can be at most the lower of the two callback rates\n"},
      {{"power", "paired", "--p10", "0.7", "--p01", "0.5", "--pairs", "100"},
       "twinprobe: --p01: p10 + p01 = 1.2 is above 1 \u2014 the two discordant shares together cannot exceed 1\n"},
      {{"power", "paired", "--p10", "0.05", "--p01", "0.02", "--pairs", "100", "--alpha", "0"},
       "twinprobe: --alpha: alpha must be between 0 and 1 (exclusive), got 0 \u2014 use e.g. --alpha 0.05\n"},
      {{"power", "paired", "--p10", "0.05", "--p01", "0.02", "--pairs", "100", "--lost", "1"},
       "twinprobe: --lost: the share of vacancies lost must be in [0, 1), got 1 \u2014 e.g. --lost 0.1 when one "
       "vacancy in ten closes before both probes are sent\n"},
      {{"power", "paired", "--rate", "0.1", "--ratio", "1", "--both", "0.05", "--power", "0.8"},
       "twinprobe: --ratio: the two arms are called back equally often, so no number of vacancies can show a gap "
       "\u2014 give the smallest gap worth detecting\n"},
      {{"power", "unpaired", "--p1", "0", "--p2", "0.1", "--n", "100"},
       "twinprobe: --p1: a callback rate must be between 0 and 1 (exclusive), got 0 \u2014 use e.g. --p1 0.10\n"},
      {{"power", "unpaired", "--p1", "0.1", "--p2", "1", "--power", "0.9"},
       "twinprobe: --p2: a callback rate must be between 0 and 1 (exclusive), got 1 \u2014 use e.g. --p2 0.07\n"},
  };
  for (const auto& c : cases) {
    auto r = RunCli(c.args);
    INFO(c.args[1] << " " << c.args[2] << " " << c.args[3]);
    CHECK(r.exit_code == 1);
    CHECK(r.err == c.err);
    CHECK(r.out.empty());
  }
}

TEST_CASE("power cli: asking for nothing, or for two things at once, is a usage error (exit 2)") {
  auto none = RunCli({"power", "paired", "--p10", "0.05", "--p01", "0.02"});
  CHECK(none.exit_code == 2);
  CHECK(none.err ==
        "twinprobe: nothing to solve for \u2014 give --pairs N to get the power, or --power P to get the number of "
        "vacancies\n");
  auto mixed = RunCli({"power", "paired", "--p10", "0.05", "--rate", "0.1", "--pairs", "10"});
  CHECK(mixed.exit_code == 2);
  auto half = RunCli({"power", "paired", "--p10", "0.05", "--pairs", "10"});
  CHECK(half.exit_code == 2);
  CHECK(half.err == "twinprobe: --p10 and --p01 go together \u2014 give both discordant shares, e.g. --p10 0.05 --p01 "
                    "0.02\n");
}

TEST_CASE("power cli: unpaired with unequal arms and a one-sided test") {
  auto r = RunCli({"--json", "power", "unpaired", "--p1", "0.12", "--p2", "0.07", "--power", "0.8", "--ratio", "2",
                   "--alternative", "one-sided"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  const double n = stats::NormalTwoProportionSampleSize(0.12, 0.07, 0.05, 0.8, 1, false, 2);
  CHECK_THAT(j["n_unrounded"].get<double>(), WithinRel(n, 1e-12));
  CHECK(j["n"] == 310);
  CHECK(j["n_other"] == 619);
  CHECK(j["applications"] == 929);
  CHECK(j["alternative"] == "one-sided");
  CHECK(j["test"] == "two proportions, normal approximation (as R's power.prop.test), one-sided");
  auto text = RunCli({"power", "unpaired", "--p1", "0.12", "--p2", "0.07", "--power", "0.8", "--ratio", "2",
                      "--alternative", "one-sided"});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.rfind("Unpaired design: one probe per vacancy, two independent arms; normal approximation, one-sided "
                       "alpha 0.05.\nThe other arm gets 2 times the reference arm's vacancies (--ratio 2).\n",
                       0) == 0);
  CHECK(text.out.find("To show this gap with 80% power at the 5% level, test 310 vacancies for the reference arm and "
                      "619 for the other (929 applications in all; unrounded 309.48 and 618.95).\n") !=
        std::string::npos);
  CHECK(text.out.find("  reference-arm vacancies   power\n                      155   0.560\n") != std::string::npos);
  CHECK(text.out.find("\n                      310   0.801\n") != std::string::npos);
}

TEST_CASE("power cli: unpaired strict power counts both tails as R's strict = TRUE") {
  auto r = RunCli({"--json", "power", "unpaired", "--p1", "0.12", "--p2", "0.07", "--n", "300", "--strict"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK_THAT(j["power"].get<double>(),
             WithinRel(stats::NormalTwoProportionPower(300, 0.12, 0.07, 0.05, 2, true), 1e-14));
  CHECK(j["strict"] == true);
  auto text = RunCli({"power", "unpaired", "--p1", "0.12", "--p2", "0.07", "--n", "300", "--strict"});
  CHECK(text.out.find("Both tails count as finding the gap (R's strict = TRUE): a result in the wrong direction counts "
                      "too.\n") != std::string::npos);
  CHECK(text.out.find("With 300 vacancies per arm (600 applications), the study has a 55.1% chance of showing this gap "
                      "at the 5% level, if it is real.\n") != std::string::npos);
}

TEST_CASE("power cli: sets power for a budget, exact for a small study") {
  auto r = RunCli({"--json", "power", "sets", "--rates", "0.2,0.5,0.6", "--vacancies", "12"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["applications"] == 36);
  CHECK(j["overall"]["method"] == "exact");
  CHECK_THAT(j["overall"]["power"].get<double>(),
             WithinRel(stats::ExactCochranPower(12, {0.2, 0.5, 0.6}, 0.05), 1e-14));
  CHECK(j["pairwise"]["arms"] == nlohmann::json({2, 3}));
  CHECK_THAT(j["pairwise"]["power"].get<double>(),
             WithinRel(stats::McNemarExactPower(12, {0.5 * 0.4, 0.6 * 0.5}, 0.05 / 3), 1e-14));
  auto text = RunCli({"power", "sets", "--rates", "0.2,0.5,0.6", "--vacancies", "12"});
  CHECK(text.out ==
        "Sets design: each vacancy receives one probe of each of 3 arms, callback rates 20.0%, 50.0%, 60.0%, outcomes "
        "independent within a vacancy.\n"
        "Overall test: Cochran's Q, chi-square on 2 df, alpha 0.05.\n"
        "Smallest pairwise gap: arm 2 (50.0%) against arm 3 (60.0%), exact McNemar at alpha 0.01667 (0.05 / 3 pairs: "
        "Bonferroni, the first step of Holm).\n"
        "\n"
        "With 12 vacancies (36 applications):\n"
        "  overall test: 42.8% power (exact, summed over every outcome)\n"
        "  smallest pairwise gap: 0.9% power (exact)\n"
        "  smallest pairwise gap after Holm over the 3 pairs, as analyze adjusts: 0.9% power (exact)\n"
        "Vacancies that call everyone back more readily make a set's outcomes alike; with the same rates that raises "
        "the power of these within-set tests, so the numbers above are conservative.\n");
}

TEST_CASE("power cli: sets power by simulation carries its seed and Monte Carlo error") {
  auto r = RunCli({"--json", "power", "sets", "--rates", "0.12,0.09,0.07", "--vacancies", "500", "--seed", "3",
                   "--replicates", "2000"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["overall"]["method"] == "simulation");
  CHECK(j["overall"]["seed"] == 3);
  CHECK(j["overall"]["replicates"] == 2000);
  const double p = stats::SimulatedCochranPower(500, {0.12, 0.09, 0.07}, 0.05, 3, 2000);
  CHECK_THAT(j["overall"]["power"].get<double>(), WithinRel(p, 1e-15));
  CHECK_THAT(j["overall"]["standard_error"].get<double>(), WithinRel(std::sqrt(p * (1 - p) / 2000), 1e-12));
}

TEST_CASE("power cli: sets sample size for both goals") {
  auto r = RunCli({"--json", "power", "sets", "--rates", "0.30,0.15,0.10", "--power", "0.8"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  const auto size = stats::SampleSizeForSets({0.30, 0.15, 0.10}, 0.05, 0.8, 1, 4000);
  CHECK(j["overall"]["vacancies"] == size.overall);
  CHECK(j["pairwise"]["vacancies"] == size.pairwise);
  CHECK(j["vacancies"] == std::max(size.overall, size.pairwise));
  CHECK(j["applications"] == 3 * std::max(size.overall, size.pairwise));
  auto text = RunCli({"power", "sets", "--rates", "0.30,0.15,0.10", "--power", "0.8"});
  CHECK(text.out.find("  smallest pairwise gap: 950 vacancies (2,850 applications), exact\n"
                      "A plan for both needs 950 vacancies (2,850 applications).\n") != std::string::npos);
}

TEST_CASE("power cli: sets and unpaired plan options refuse what they cannot do") {
  struct Case {
    std::vector<std::string> args;
    int exit_code;
    std::string err;
  };
  const std::vector<Case> cases = {
      {{"power", "sets", "--rates", "0.1", "--vacancies", "100"}, 1,
       "twinprobe: --rates: a sets design needs 2 to 8 arms, got 1 \u2014 give one callback rate per arm, separated by "
       "commas, e.g. --rates 0.12,0.09,0.07\n"},
      {{"power", "sets", "--rates", "0.1,1.2", "--vacancies", "100"}, 1,
       "twinprobe: --rates: rate 2 must be between 0 and 1 (exclusive), got 1.2 \u2014 give callback rates as shares, "
       "e.g. 0.12 for 12%\n"},
      {{"power", "sets", "--rates", "0.1,0.1,0.1", "--power", "0.8"}, 1,
       "twinprobe: --rates: every arm has the same callback rate, so no number of vacancies can show a difference "
       "\u2014 give the smallest differences worth detecting\n"},
      {{"power", "sets", "--rates", "0.1,0.2"}, 2,
       "twinprobe: nothing to solve for \u2014 give --vacancies N to get the power, or --power P to get the number of "
       "vacancies\n"},
      {{"power", "sets", "--vacancies", "10"}, 2,
       "twinprobe: --rates is required \u2014 give each arm's expected callback rate, e.g. --rates 0.12,0.09,0.07\n"},
      {{"power", "unpaired", "--p1", "0.1", "--p2", "0.07", "--n", "100", "--alternative", "sideways"}, 2,
       "twinprobe: --alternative must be one-sided or two-sided, got 'sideways' \u2014 use --alternative one-sided for "
       "a plan that tests one direction only\n"},
      {{"power", "unpaired", "--p1", "0.1", "--p2", "0.07", "--n", "100", "--alternative", "one-sided", "--strict"}, 2,
       "twinprobe: --strict counts the far tail of a two-sided test, and a one-sided test has none \u2014 leave out "
       "--strict, or use --alternative two-sided\n"},
      {{"power", "unpaired", "--p1", "0.1", "--p2", "0.07", "--n", "100", "--ratio", "0"}, 1,
       "twinprobe: --ratio: the ratio of the other arm's vacancies to the reference arm's must be positive, got 0 "
       "\u2014 e.g. --ratio 2 when the other arm gets twice as many vacancies\n"},
      {{"power", "unpaired", "--p1", "0.1", "--p2", "0.07", "--n", "100", "--ratio", "2", "--exact"}, 2,
       "twinprobe: --exact covers equal arms and the two-sided Fisher test only \u2014 leave out --exact (normal "
       "approximation), or --ratio, --alternative and --strict\n"},
  };
  for (const auto& c : cases) {
    auto r = RunCli(c.args);
    INFO(c.args[1] << " " << c.args[2] << " " << c.args[3]);
    CHECK(r.exit_code == c.exit_code);
    CHECK(r.err == c.err);
    CHECK(r.out.empty());
  }
}
