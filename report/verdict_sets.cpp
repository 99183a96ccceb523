#include "report/verdict_sets.h"

#include <cmath>
#include <sstream>

#include "report/k_level_report.h"
#include "report/p_value.h"
#include "report/plain_summary.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Cap(std::string s) {
  if (!s.empty() && s[0] >= 'a' && s[0] <= 'z') s[0] = static_cast<char>(s[0] - 'a' + 'A');
  return s;
}

std::string Alpha(double alpha) {
  std::ostringstream o;
  o << alpha;
  return o.str();
}

// The factor the headline speaks of: the first with an overall test,
// preferring one varied within sets (its test keeps the sets).
const FactorAnalysis* HeadlineFactor(const KLevelAnalysis& k) {
  const FactorAnalysis* found = nullptr;
  for (const auto& f : k.factors) {
    if (!f.overall) continue;
    if (f.within) return &f;
    if (!found) found = &f;
  }
  return found;
}

// Followed by " p = …" (PlainP).
std::string TestName(const OverallTest& t) {
  if (t.method == "cochran_q") return t.p_exact ? "Cochran's Q test, exact permutation" : "Cochran's Q test, chi-square";
  return t.p_exact ? "Freeman-Halton exact test," : "Pearson's chi-square test,";
}

// The two-factor model's likelihood-ratio test of a factor's main effect,
// when it is estimable (a factor varied within sets).
const EffectTest* ModelTest(const KLevelAnalysis& k, const std::string& factor) {
  if (!k.model.present || !k.model.failure.empty()) return nullptr;
  for (const EffectTest& t : k.model.tests)
    if (t.name == factor && t.estimable) return &t;
  return nullptr;
}

std::string LevelRates(const FactorAnalysis& f) {
  std::string s;
  for (size_t i = 0; i < f.levels.size(); ++i)
    s += (i ? (i + 1 == f.levels.size() ? " and " : ", ") : "") + f.levels[i].label + " " + FormatPercent(f.levels[i].rate);
  return s;
}

const ArmComparison* UnpairedComparison(const AnalysisResult& r) {
  if (r.kind != "unpaired" || r.arms.size() != 2 || r.effects.comparisons.empty()) return nullptr;
  return &r.effects.comparisons.front();
}

}  // namespace

std::string SetsHeadline(const AnalysisResult& r) {
  if (r.has_paired) return "";
  if (const FactorAnalysis* f = r.k_levels.present ? HeadlineFactor(r.k_levels) : nullptr) {
    // With two factors the model's test of the factor (holding the other
    // fixed) decides, and the interaction is named after it.
    // A factor varied between vacancies is judged by its test at the
    // vacancies (its k x 2 table counts a vacancy's probes as independent).
    const EffectTest* model = ModelTest(r.k_levels, f->name);
    const bool by_vacancy = !model && f->vacancy_test.present;
    const double p = model ? model->p : by_vacancy ? f->vacancy_test.p : f->overall->p();
    const std::string test = model        ? "likelihood-ratio test of " + f->label + " in the conditional logistic model, " + PlainP(p)
                             : by_vacancy ? "permutation test of its levels among the vacancies, " + PlainP(p)
                                          : TestName(*f->overall) + " " + PlainP(p);
    const std::string groups = std::to_string(f->levels.size()) + " " + f->label + " groups (" + LevelRates(*f) + ")";
    std::string s = p < r.alpha ? "Positive answers differed across the " + groups +
                                      "; chance alone is an unlikely explanation (" + test + ")"
                                : "Positive answers did not differ clearly across the " + groups +
                                      "; the differences could well be chance (" + test + ")";
    const auto& tests = r.k_levels.model.tests;
    if (model && tests.size() == 3 && tests[2].estimable) {
      const std::string& other = r.k_levels.factors[0].name == f->name ? r.k_levels.factors[1].label : r.k_levels.factors[0].label;
      s += tests[2].p < r.alpha ? "; the " + f->label + " difference depended on " + other + " (interaction " + PlainP(tests[2].p) + ")"
                                : "; it did not clearly depend on " + other + " (interaction " + PlainP(tests[2].p) + ")";
    }
    return s + ".";
  }
  if (const ArmComparison* c = UnpairedComparison(r)) {
    const ArmResult& ref = r.arms[0];
    const ArmResult& other = r.arms[1];
    if (ref.rate == other.rate)
      return "Both groups received positive answers equally often (" + FormatPercent(ref.rate) + "); the data show no difference.";
    const ArmResult& hi = ref.rate > other.rate ? ref : other;
    const ArmResult& lo = ref.rate > other.rate ? other : ref;
    std::string s = Cap(ArmName(r, hi.label)) + " applicants received positive answers more often than " + ArmName(r, lo.label) +
                    " applicants (" + FormatPercent(hi.rate) + " against " + FormatPercent(lo.rate) + "); ";
    if (c->p.p < r.alpha) return s + "chance alone is an unlikely explanation (Fisher's exact test, " + PlainP(c->p.p) + ").";
    return s + "the difference could well be chance (Fisher's exact test, " + PlainP(c->p.p) + "), so the test does not show one.";
  }
  return "";
}

std::string SetsHowSure(const AnalysisResult& r) {
  if (r.has_paired) return "";
  std::ostringstream o;
  const int conf = static_cast<int>(std::lround(r.confidence * 100));
  if (r.k_levels.present) {
    for (const FactorAnalysis& f : r.k_levels.factors) {
      if (const std::string s = OverallSentence(f, r.alpha, r.records); !s.empty()) o << s << " ";
      if (const std::string s = VacancyTestSentence(f, r.alpha); !s.empty()) o << s << " ";
      int rejected = 0;
      for (const LevelPair& p : f.pairwise) rejected += p.p_adjusted < r.alpha;
      if (f.pairwise.size() > 1)  // one pair is the overall test again
        o << "Of the " << f.pairwise.size() << " comparisons of two " << f.label << " groups ("
          << (f.within ? "exact McNemar" : "Fisher's exact") << " tests, two-sided, adjusted by " << r.effects.correction
          << "), " << rejected << (rejected == 1 ? " rejects" : " reject") << " equal treatment. ";
      if (const std::string s = TrendSentence(f, r.alpha, r.confidence); !s.empty()) o << s << " ";
    }
    for (const EffectTest& t : r.k_levels.model.tests) o << EffectTestSentence(t, r.alpha) << " ";
  } else if (const ArmComparison* c = UnpairedComparison(r)) {
    o << "If employers had no preference, a difference in callback rates at least as large as this one would "
         "happen by chance with probability "
      << (c->p.p < 0.001 ? "below one in a thousand" : FormatP(c->p.p)) << " (" << PlainP(c->p.p)
      << ", Fisher's exact test, two-sided). ";
    if (c->p.p < r.alpha)
      o << "That is below the study's threshold of " << Alpha(r.alpha) << ", so the test rejects equal treatment. ";
    else
      o << "That is not below the study's threshold of " << Alpha(r.alpha)
        << ", so the test does not show a difference. This is not proof that there is none; a larger study may find one. ";
  } else {
    return "";
  }
  o << "The " << conf
    << "% confidence intervals of the callback rates show how high or low each group's true callback rate may plausibly be.";
  return o.str();
}

}  // namespace twinprobe
