// The words of every calc mode under each --alternative: each p-value
// sentence names its test and sidedness and says only what the test
// rejects, and every interval carries its level, sidedness and method.
#include <catch2/catch.hpp>

#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include "testing/testing.h"

using twinprobe::testing::RunCli;

namespace {

// The line of `out` that starts with `prefix` (after trimming), or "".
std::string LineStarting(const std::string& out, const std::string& prefix) {
  std::istringstream in(out);
  std::string line;
  while (std::getline(in, line)) {
    const size_t start = line.find_first_not_of(' ');
    if (start != std::string::npos && line.compare(start, prefix.size(), prefix) == 0) return line.substr(start);
  }
  return "";
}

// Every "NN% CI" is followed by its sidedness: none stands alone.
void CheckEveryIntervalSaysItsSide(const std::string& out) {
  const std::regex ci(R"((\d+(\.\d+)?)% CI (\S+))");
  for (auto it = std::sregex_iterator(out.begin(), out.end(), ci); it != std::sregex_iterator(); ++it) {
    INFO(out);
    const std::string side = (*it)[3];
    CHECK((side == "two-sided" || side == "one-sided"));
  }
}

std::string Run(const std::vector<std::string>& args) {
  auto r = RunCli(args);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CheckEveryIntervalSaysItsSide(r.out);
  return r.out;
}

}  // namespace

TEST_CASE("calc wording: binom names the exact binomial test and its side under each alternative") {
  // 10 successes in 100 trials against 0.2 (the case that used to read
  // "the success rate differs from 0.2" under --alternative less).
  auto two = Run({"calc", "binom", "--x", "10", "--n", "100", "--p", "0.2"});
  CHECK(LineStarting(two, "At the") ==
        "At the 0.05 level, the exact binomial test, two-sided, rejects a success rate of 0.2 in favour of a different rate "
        "(p = 0.0118).");
  CHECK(LineStarting(two, "Clopper-Pearson interval (exact)") == "Clopper-Pearson interval (exact)                 95% CI two-sided [0.049, 0.1762]");
  auto less = Run({"calc", "binom", "--x", "10", "--n", "100", "--p", "0.2", "--alternative", "less"});
  CHECK(LineStarting(less, "At the") ==
        "At the 0.05 level, the exact binomial test, one-sided (less), rejects a success rate of 0.2 or more in favour of a "
        "lower rate (p = 0.0057).");
  CHECK(LineStarting(less, "exact binomial p") == "exact binomial p, one-sided (less)               0.0057");
  CHECK(LineStarting(less, "Wilson score interval") == "Wilson score interval                            95% CI one-sided (less) [0, 0.1604]");
  auto greater = Run({"calc", "binom", "--x", "10", "--n", "100", "--p", "0.2", "--alternative", "greater"});
  CHECK(LineStarting(greater, "At the") ==
        "At the 0.05 level, the exact binomial test, one-sided (greater), does not reject a success rate of 0.2 or less "
        "(p = 0.998); this is not evidence for it.");
  CHECK(LineStarting(greater, "Clopper-Pearson interval (exact)") ==
        "Clopper-Pearson interval (exact)                 95% CI one-sided (greater) [0.05526, 1]");
}

TEST_CASE("calc wording: fisher names Fisher's exact test and its side, and its Woolf interval follows the side") {
  auto two = Run({"calc", "fisher", "--table", "3,1,1,3"});
  CHECK(LineStarting(two, "At the") ==
        "At the 0.05 level, Fisher's exact test, two-sided, does not reject equal positive rates in the two arms "
        "(p = 0.486); this is not evidence for it.");
  auto less = Run({"calc", "fisher", "--table", "3,1,1,3", "--alternative", "less"});
  CHECK(LineStarting(less, "At the") ==
        "At the 0.05 level, Fisher's exact test, one-sided (less), does not reject a positive rate in the reference arm "
        "at least the other arm's (p = 0.986); this is not evidence for it.");
  CHECK(LineStarting(less, "sample odds ratio") == "sample odds ratio ad/bc                          9   95% CI one-sided (less) [0, 132.1], Woolf");
  // Fisher's convictions of twins (Fisher 1962; R's fisher.test help page):
  // one-sided (less) p = 0.00046518.
  auto convictions = Run({"calc", "fisher", "--table", "2,10,15,3", "--alternative", "less"});
  CHECK(LineStarting(convictions, "At the") ==
        "At the 0.05 level, Fisher's exact test, one-sided (less), rejects a positive rate in the reference arm at least "
        "the other arm's in favour of a lower rate in the reference arm (p = 4.65e-04).");
  auto greater = Run({"calc", "fisher", "--table", "3,1,1,3", "--alternative", "greater"});
  CHECK(LineStarting(greater, "conditional MLE odds ratio") ==
        "conditional MLE odds ratio                       6.408   95% CI one-sided (greater) [0.3136, infinite], exact (conditional)");
}

TEST_CASE("calc wording: mcnemar names the exact McNemar test, two-sided, and labels every interval") {
  auto out = Run({"calc", "mcnemar", "--table", "45,66,32,257"});
  CHECK(LineStarting(out, "At the") ==
        "At the 0.05 level, the exact McNemar test, two-sided, rejects equal treatment of the arms in favour of unequal "
        "treatment: the reference arm was favoured in 66 of 98 discordant pairs (p = 7.70e-04).");
  CHECK(LineStarting(out, "conditional odds ratio b/c") ==
        "conditional odds ratio b/c                       2.062   95% CI two-sided [1.333, 3.252], exact (Clopper-Pearson)");
  CHECK(LineStarting(out, "the same with the mid-p interval") ==
        "the same with the mid-p interval               2.062   95% CI two-sided [1.359, 3.179], mid-p");
  CHECK(LineStarting(out, "callback-rate ratio") ==
        "callback-rate ratio (a+b)/(a+c)                  1.442   95% CI two-sided [1.168, 1.779], Bonett-Price");
  auto none = Run({"calc", "mcnemar", "--table", "10,4,4,20"});
  CHECK(LineStarting(none, "At the") ==
        "At the 0.05 level, the exact McNemar test, two-sided, does not reject equal treatment of the arms (p = 1); this "
        "is not evidence for it.");
}

TEST_CASE("calc wording: mh names the CMH or the exact conditional test and says the tables are unpaired") {
  const std::string rabbits = "0,6,0,5;3,3,0,6;6,0,2,4;5,1,6,0;2,0,5,0";  // Agresti's penicillin and rabbits
  auto cmh = Run({"calc", "mh", "--tables", rabbits});
  CHECK(LineStarting(cmh, "At the") ==
        "At the 0.05 level, the Cochran-Mantel-Haenszel test with continuity correction, two-sided, rejects a common odds "
        "ratio of 1 across the strata in favour of a common odds ratio different from 1 (p = 0.0475).");
  CHECK(LineStarting(cmh, "These tables") ==
        "These tables count every application as independent: for matched pairs use calc homogeneity.");
  auto exact = Run({"calc", "mh", "--tables", rabbits, "--exact"});
  CHECK(LineStarting(exact, "At the") ==
        "At the 0.05 level, the exact conditional test of a common odds ratio, two-sided, rejects a common odds ratio of 1 "
        "across the strata in favour of a common odds ratio different from 1 (p = 0.0399).");
}

TEST_CASE("calc wording: ratio labels its Bonett-Price interval with the side asked for") {
  CHECK(LineStarting(Run({"calc", "ratio", "--table", "45,66,32,257"}), "callback-rate ratio") ==
        "callback-rate ratio (a+b)/(a+c)                  1.442   95% CI two-sided [1.168, 1.779], Bonett-Price");
  CHECK(LineStarting(Run({"calc", "ratio", "--table", "45,66,32,257", "--alternative", "less"}), "callback-rate ratio") ==
        "callback-rate ratio (a+b)/(a+c)                  1.442   95% CI one-sided (less) [0, 1.72], Bonett-Price");
  CHECK(LineStarting(Run({"calc", "ratio", "--table", "45,66,32,257", "--alternative", "greater"}), "callback-rate ratio") ==
        "callback-rate ratio (a+b)/(a+c)                  1.442   95% CI one-sided (greater) [1.209, infinite], Bonett-Price");
}

TEST_CASE("calc wording: homogeneity names the chi-square test, or the exact test when counts are small") {
  auto large = Run({"calc", "homogeneity", "--strata", "30,10;20,12;16,10"});
  CHECK(LineStarting(large, "At the") ==
        "At the 0.05 level, Pearson's chi-square test of homogeneity (2 df), does not reject the same conditional odds "
        "ratio b/c in every stratum (p = 0.405); this is not evidence for it.");
  auto small = Run({"calc", "homogeneity", "--strata", "3,0;1,4;5,1"});
  CHECK(LineStarting(small, "At the") ==
        "At the 0.05 level, Fisher's exact test of the strata x (b, c) table, two-sided, does not reject the same "
        "conditional odds ratio b/c in every stratum (p = 0.0684); this is not evidence for it.");
  CHECK(LineStarting(small, "Some expected") ==
        "Some expected counts are small, so the chi-square approximation is doubtful; the exact test is the one to read.");
}

TEST_CASE("calc wording: equivalence says what the two one-sided tests show, and what failing shows") {
  auto shown = Run({"calc", "equivalence", "--table", "300,40,42,618", "--margin", "0.05"});
  CHECK(LineStarting(shown, "At the") ==
        "At the 0.05 level, both one-sided tests reject a difference outside [-0.05, 0.05]: the two arms' callback rates "
        "are equivalent within the margin (p = 8.77e-07).");
  CHECK(LineStarting(shown, "paired difference") ==
        "paired difference (b-c)/n                        -0.002   90% CI two-sided [-0.01712, 0.01307], Tango score");
  auto not_shown = Run({"calc", "equivalence", "--table", "45,66,32,257", "--margin", "-0.05,0.1"});
  CHECK(LineStarting(not_shown, "At the") ==
        "At the 0.05 level, the two one-sided tests do not both reject a difference outside [-0.05, 0.1] (p = 0.27): "
        "equivalence is not shown, which is not evidence of a difference.");
  CHECK(LineStarting(not_shown, "upper test") ==
        "upper test, one-sided (less)                     H0: difference >= 0.1   z = -0.6128   p = 0.27");
}

TEST_CASE("calc wording: employers names the sign-flip test and its side, and notes when pairs would decide otherwise") {
  const std::string employers = "3,0;2,1;4,0;1,0;2,0;0,1;3,0";
  auto two = Run({"calc", "employers", "--employers", employers});
  CHECK(LineStarting(two, "At the") ==
        "At the 0.05 level, the employer sign-flip test, two-sided, does not reject equal treatment of the arms "
        "(p = 0.0625); this is not evidence for it.");
  CHECK(LineStarting(two, "The pair-level") ==
        "The pair-level exact McNemar test, which counts every pair as independent, reaches the opposite decision "
        "(p = 0.00235): employers with several vacancies carry less information than their pairs suggest.");
  auto less = Run({"calc", "employers", "--employers", employers, "--alternative", "less"});
  CHECK(LineStarting(less, "At the") ==
        "At the 0.05 level, the employer sign-flip test, one-sided (less), does not reject equal treatment (or an "
        "advantage for the reference arm) (p = 0.992); this is not evidence for it.");
  auto greater = Run({"calc", "employers", "--employers", employers, "--alternative", "greater"});
  CHECK(LineStarting(greater, "At the") ==
        "At the 0.05 level, the employer sign-flip test, one-sided (greater), rejects equal treatment (or an advantage "
        "for the other arm) in favour of the reference arm being favoured (p = 0.0312).");
  CHECK(LineStarting(greater, "employer sign-flip p") == "employer sign-flip p, one-sided (greater)        0.0312 (exact)");
}

TEST_CASE("calc wording: bad input to the paired calculators gets one clear line and exit 1") {
  auto strata = RunCli({"calc", "homogeneity", "--strata", "3,1;2"});
  CHECK(strata.exit_code == 1);
  CHECK(strata.err == "twinprobe: --strata: expected two counts b,c per group, got '2' \u2014 give each stratum's discordant "
                      "counts as b,c separated by ';', e.g. --strata \"12,4;9,8;15,3\"\n");
  auto one = RunCli({"calc", "homogeneity", "--strata", "3,1;0,0"});
  CHECK(one.exit_code == 1);
  CHECK(one.err == "twinprobe: --strata: fewer than two strata have discordant pairs, so there is nothing to compare \u2014 give "
                   "each stratum's discordant counts as b,c separated by ';', e.g. --strata \"12,4;9,8;15,3\"\n");
  auto margin = RunCli({"calc", "equivalence", "--table", "1,2,3,4", "--margin", "0.05,-0.05"});
  CHECK(margin.exit_code == 1);
  CHECK(margin.err == "twinprobe: --margin: the margin must lie strictly between -1 and 1 with the lower end below 0 and the upper "
                      "above 0, got '0.05,-0.05' \u2014 give the margin as one positive difference, e.g. --margin 0.05, or as "
                      "lower,upper, e.g. --margin -0.05,0.1\n");
  auto none = RunCli({"calc", "employers", "--employers", "1,1;0,0"});
  CHECK(none.exit_code == 0);
  auto empty = RunCli({"calc", "employers", "--employers", "0,0;0,0"});
  CHECK(empty.exit_code == 1);
  CHECK(empty.err == "twinprobe: --employers: no employer has a discordant pair \u2014 give each employer's discordant counts as "
                     "b,c separated by ';', e.g. --employers \"3,0;1,1;0,2;4,1\"\n");
  CHECK(empty.out.empty());
}

TEST_CASE("calc wording: a one-sided interval at a level of 50% or less is refused, not printed on the wrong side") {
  auto r = RunCli({"calc", "binom", "--x", "3", "--n", "10", "--alternative", "less", "--conf", "0.4"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: --conf: a one-sided interval needs a confidence level above 0.5, got 0.4 \u2014 e.g. --conf 0.95\n");
  auto f = RunCli({"calc", "fisher", "--table", "3,1,1,3", "--alternative", "greater", "--conf", "0.5"});
  CHECK(f.exit_code == 1);
  CHECK(f.out.empty());
}
