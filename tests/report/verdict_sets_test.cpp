// The headline verdict and "How sure we are" for every kind of design:
// paired, sets (three ages), unpaired and two factors. The results are made
// by the analysis functions on counted sets; the sentences are asserted
// whole. The p-values inside them are checked against R in
// tests/analysis/k_level_test.cpp (same sets).
#include <catch2/catch.hpp>

#include <string>

#include "analysis/analyze.h"
#include "report/plain_summary.h"

using namespace twinprobe;

namespace {

void AddSets(std::vector<SetOutcome>& sets, int count, std::vector<std::pair<int, bool>> probes) {
  sets.push_back({std::move(probes), {}, count});
}

// Fills the result's arms from the sets, as Analyze does.
AnalysisResult FromSets(const std::string& kind, const std::vector<std::string>& labels,
                        const std::vector<SetOutcome>& sets) {
  AnalysisResult r;
  r.kind = kind;
  for (size_t a = 0; a < labels.size(); ++a) r.arms.push_back({labels[a], a == 0, 0, 0, 0, {}});
  for (const SetOutcome& s : sets) {
    r.sets_analysed += s.count;
    for (const auto& [arm, positive] : s.probes) {
      r.arms[static_cast<size_t>(arm)].probes += s.count;
      if (positive) r.arms[static_cast<size_t>(arm)].positive += s.count;
    }
  }
  for (ArmResult& a : r.arms) {
    a.rate = static_cast<double>(a.positive) / static_cast<double>(a.probes);
    r.probes_sent += a.probes;
  }
  EffectsInput e;
  e.kind = kind;
  e.arm_labels = labels;
  e.sets = sets;
  r.effects = ComputeEffects(e);
  return r;
}

// Three ages per set: the patterns of tests/analysis/k_level_test.cpp (women).
std::vector<SetOutcome> ThreeAges(int offset, bool male) {
  std::vector<SetOutcome> s;
  const int counts_f[] = {10, 9, 7, 3, 2, 4, 2, 30}, counts_m[] = {8, 5, 4, 5, 3, 2, 4, 25};
  const int pattern[8][3] = {{1, 1, 1}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}, {0, 0, 1}, {1, 0, 1}, {0, 1, 1}, {0, 0, 0}};
  for (int i = 0; i < 8; ++i)
    AddSets(s, male ? counts_m[i] : counts_f[i],
            {{offset, pattern[i][0] == 1}, {offset + 1, pattern[i][1] == 1}, {offset + 2, pattern[i][2] == 1}});
  return s;
}

std::string HowSure(const AnalysisResult& r) {
  for (const auto& p : PlainSummary(r))
    if (p.heading == "How sure we are") return p.text;
  return "";
}

}  // namespace

TEST_CASE("verdict: a paired study names the favoured group and the exact McNemar test") {
  std::vector<SetOutcome> sets;
  AddSets(sets, 20, {{0, true}, {1, true}});
  AddSets(sets, 12, {{0, true}, {1, false}});
  AddSets(sets, 3, {{0, false}, {1, true}});
  AddSets(sets, 65, {{0, false}, {1, false}});
  AnalysisResult r = FromSets("paired", {"origin=inland", "origin=coastal"}, sets);
  r.has_paired = true;
  r.reference_label = "origin=inland";
  r.other_label = "origin=coastal";
  r.paired = r.effects.comparisons[0].pairs;
  r.mcnemar_exact_p = r.effects.comparisons[0].mcnemar.exact.p;  // binom.test(12, 15)$p.value = 0.03515625
  CHECK(Headline(r) ==
        "Inland applicants received positive answers more often than coastal applicants (32.0% against 23.0%); "
        "chance alone is an unlikely explanation (p = 0.0352).");
}

TEST_CASE("verdict: a sets study with three ages names Cochran's Q and each pairwise decision") {
  KLevelInput in;
  in.kind = "sets";
  in.arm_labels = {"age=28", "age=45", "age=58"};
  in.factors = {{"age", {"28", "45", "58"}, "28", {28, 45, 58}, "", {}}};
  in.sets = ThreeAges(0, false);
  AnalysisResult r = FromSets("sets", in.arm_labels, in.sets);
  r.k_levels = AnalyzeKLevels(in);
  CHECK(Headline(r) ==
        "Positive answers differed across the 3 age groups (28 44.8%, 45 32.8% and 58 26.9%); chance alone is an "
        "unlikely explanation (Cochran's Q test, exact permutation p = 0.0146).");
  CHECK(HowSure(r) ==
        "Cochran's Q test of equal positive rates across the 3 levels of age (within sets, 27 informative sets) rejects "
        "equality at alpha 0.05: Q = 8.3 on 2 df, exact permutation p = 0.0146 (chi-square p = 0.0158). Of the 3 "
        "comparisons of two age groups (exact McNemar tests, two-sided, adjusted by holm), 1 rejects equal treatment. "
        "The conditional logistic regression slope across age (scores 28, 45, 58; likelihood-ratio test, two-sided) "
        "rejects the hypothesis of no linear trend at alpha 0.05: odds ratio per score unit 0.952, 95% profile CI "
        "[0.918, 0.985], LR X^2 = 8.52 on 1 df, p = 0.00351. The 95% confidence intervals of the callback rates show "
        "how high or low each group's true callback rate may plausibly be.");
}

TEST_CASE("verdict: an unpaired study names Fisher's exact test") {
  std::vector<SetOutcome> sets;
  AddSets(sets, 30, {{0, true}});
  AddSets(sets, 70, {{0, false}});
  AddSets(sets, 16, {{1, true}});
  AddSets(sets, 84, {{1, false}});
  AnalysisResult r = FromSets("unpaired", {"origin=inland", "origin=coastal"}, sets);
  // R: fisher.test(matrix(c(30, 70, 16, 84), 2, byrow = TRUE))$p.value = 0.02826478.
  CHECK(Headline(r) ==
        "Inland applicants received positive answers more often than coastal applicants (30.0% against 16.0%); "
        "chance alone is an unlikely explanation (Fisher's exact test, p = 0.0283).");
  CHECK(HowSure(r) ==
        "If employers had no preference, a difference in callback rates at least as large as this one would happen "
        "by chance with probability 0.0283 (p = 0.0283, Fisher's exact test, two-sided). That is below the study's "
        "threshold of 0.05, so the test rejects equal treatment. The 95% confidence intervals of the callback rates "
        "show how high or low each group's true callback rate may plausibly be.");
}

TEST_CASE("verdict: a two-factor study states the main effect and the interaction") {
  KLevelInput in;
  in.kind = "sets";
  in.arm_labels = {"age=28,gender=f", "age=45,gender=f", "age=58,gender=f",
                   "age=28,gender=m", "age=45,gender=m", "age=58,gender=m"};
  in.factors = {{"age", {"28", "45", "58"}, "28", {}, "", {}}, {"gender", {"f", "m"}, "f", {}, "", {}}};
  in.sets = ThreeAges(0, false);
  for (const SetOutcome& s : ThreeAges(3, true)) in.sets.push_back(s);
  AnalysisResult r = FromSets("sets", in.arm_labels, in.sets);
  r.k_levels = AnalyzeKLevels(in);
  // The model's test of age (holding gender fixed) decides; clogit LR values
  // against R in tests/analysis/k_level_test.cpp.
  CHECK(Headline(r) ==
        "Positive answers differed across the 3 age groups (28 39.8%, 45 35.0% and 58 28.5%); chance alone is an "
        "unlikely explanation (likelihood-ratio test of age in the conditional logistic model, p = 0.0493); it did "
        "not clearly depend on gender (interaction p = 0.161).");
  CHECK(HowSure(r) ==
        "Cochran's Q test of equal positive rates across the 3 levels of age (within sets, 50 informative sets) does "
        "not reject equality at alpha 0.05: Q = 5.92 on 2 df, exact permutation p = 0.0552 (chi-square p = 0.0518). "
        "Of the 3 comparisons of two age groups (exact McNemar tests, two-sided, adjusted by holm), 0 reject equal "
        "treatment. The test of equal positive rates across the 2 levels of gender (k x 2 table of probes) does not "
        "reject equality at alpha 0.05: Freeman-Halton exact p = 0.913; Pearson X^2 = 0.0326 on 1 df, p = 0.857. "
        // The vacancy test's value is checked against python in tests/analysis/vacancy_test_test.cpp.
        "The test of gender at the level it was randomised at (its levels re-assigned to the 123 vacancies within "
        "the 1 block of the plan, 99999 resamples; statistic: the sum over levels of the squared positive count over "
        "the number of vacancies) does not reject equality at alpha 0.05: Monte Carlo p = 0.934 (standard error "
        "0.000784). The k x 2 test counts the probes of one vacancy as independent and is descriptive. "
        "age: the likelihood-ratio test rejects the hypothesis of no effect at alpha 0.05: X^2 = 6.02 on 2 df, "
        "p = 0.0493. gender: not estimable by the conditional model (varied between vacancies, so constant within "
        "every set: tested by re-assigning its levels to vacancies). age x gender: the likelihood-ratio test does not "
        "reject the hypothesis of no effect at alpha 0.05: X^2 = 3.65 on 2 df, p = 0.161. The 95% confidence "
        "intervals of the callback rates show how high or low each group's true callback rate may plausibly be.");
}
