#include "report/k_level_report.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "core/text.h"
#include "report/effects_report.h"
#include "report/json_number.h"
#include "report/p_value.h"
#include "report/plural.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string Fmt(double v) { return FormatEstimate(v); }
std::string FmtCi(const stats::Interval& ci) { return FormatInterval(ci); }
std::string Percent(double confidence) { return ConfidencePercent(confidence); }

nlohmann::json Ci(const stats::Interval& ci) { return nlohmann::json::array({JsonNumber(ci.low), JsonNumber(ci.high)}); }

std::string Verb(double p, double alpha) { return p < alpha ? "rejects" : "does not reject"; }

void PairText(std::ostringstream& o, const LevelPair& p, const std::string& factor, double confidence) {
  o << "  " << factor << " " << p.first_label << " vs " << p.second_label << ": " << FormatPercent(p.rate_first) << " vs "
    << FormatPercent(p.rate_second);
  if (p.paired) {
    const auto& t = p.pairs;
    o << " in " << Count(t.n(), "set", "sets") << " (a " << t.a << ", only " << p.first_label << " " << t.b << ", only "
      << p.second_label << " " << t.c << ", d " << t.d << "); exact McNemar, two-sided, " << PEquals(p.p) << ", adjusted "
      << FormatP(p.p_adjusted) << ".\n"
      << "    net discrimination (b-c)/(a+b+c) = " << Fmt(p.net.among_positive.estimate) << " "
      << FmtCi(p.net.among_positive.ci) << " (" << Percent(confidence) << " two-sided, Newcombe); conditional odds ratio b/c = "
      << Fmt(p.conditional_or.estimate) << " " << FmtCi(p.conditional_or.ci) << " (exact).\n";
  } else {
    o << "; Fisher's exact test, two-sided, " << PEquals(p.p) << ", adjusted " << FormatP(p.p_adjusted) << ".\n";
  }
}

}  // namespace

std::string LevelShown(const LevelRate& l) {
  return l.label.empty() || l.label == l.level ? l.level : l.label + " (" + l.level + ")";
}

std::string OverallSentence(const FactorAnalysis& f, double alpha, bool records) {
  if (!f.overall) return "";
  const OverallTest& t = *f.overall;
  std::ostringstream o;
  const std::string levels = std::to_string(f.levels.size()) + " levels of " + f.label;
  if (t.method == "cochran_q") {
    if (t.blocks_by.empty())
      o << "Cochran's Q test of equal positive rates across the " << levels << " (within sets, "
        << Count(t.informative_sets, "informative set", "informative sets") << ") ";
    else
      o << "Cochran's Q test of equal positive rates across the " << levels << " (within blocks of one set and one level of "
        << t.blocks_by << ", " << Count(t.informative_sets, "informative block", "informative blocks") << ") ";
    o << Verb(t.p(), alpha)
      << " equality at alpha " << Fmt(alpha) << ": Q = " << Fmt(t.statistic) << " on " << t.df << " df, "
      << (t.p_exact ? "exact permutation " : "chi-square ") << PEquals(t.p());
    if (t.p_exact) o << " (chi-square " << PEquals(t.p_asymptotic) << ")";
  } else {
    o << "The test of equal positive rates across the " << levels << " (k x 2 table of "
      << (records ? "applications" : "probes") << ") " << Verb(t.p(), alpha)
      << " equality at alpha " << Fmt(alpha) << ": " << (t.p_exact ? "Freeman-Halton exact " : "Pearson chi-square ")
      << PEquals(t.p()) << "; Pearson X^2 = " << Fmt(t.statistic) << " on " << t.df << " df, " << PEquals(t.p_asymptotic);
  }
  o << ".";
  return o.str();
}

std::string VacancyTestSentence(const FactorAnalysis& f, double alpha) {
  const VacancyPermutationTest& t = f.vacancy_test;
  if (!t.present) return "";
  std::ostringstream o;
  o << "The test of " << f.label << " at the level it was randomised at (its levels re-assigned to the "
    << Count(t.vacancies, "vacancy", "vacancies") << " within the " << Count(t.blocks, "block", "blocks")
    << " of the plan, " << Count(t.resamples, "resample", "resamples") << "; statistic: the sum over levels of the squared positive count "
    << "over the number of vacancies) " << Verb(t.p, alpha) << " equality at alpha " << Fmt(alpha)
    << ": Monte Carlo " << PEquals(t.p) << " (standard error " << Fmt(t.monte_carlo_se)
    << "). The k x 2 test counts the probes of one vacancy as independent and is descriptive.";
  return o.str();
}

std::string TrendSentence(const FactorAnalysis& f, double alpha, double confidence) {
  const TrendResult& t = f.trend;
  if (!t.present) return "";
  std::ostringstream o;
  std::string scores;
  for (size_t i = 0; i < t.scores.size(); ++i) scores += (i ? ", " : "") + Fmt(t.scores[i]);
  if (!t.defined) return "The trend test across " + f.label + " (scores " + scores + ") is not defined: " + t.note + ".";
  if (t.method == "cochran_armitage") {
    o << "The Cochran-Armitage test for a linear trend across " << f.label << " (scores " << scores << "), two-sided, "
      << Verb(t.p, alpha) << " the hypothesis of no linear trend at alpha " << Fmt(alpha) << ": X^2 = " << Fmt(t.statistic) << " on 1 df, " << PEquals(t.p) << "; rates "
      << (t.z >= 0 ? "rise" : "fall") << " with the score.";
  } else {
    o << "The conditional logistic regression slope across " << f.label << " (scores " << scores
      << "; likelihood-ratio test, two-sided) " << Verb(t.p, alpha) << " the hypothesis of no linear trend at alpha "
      << Fmt(alpha) << ": odds ratio per score unit "
      << Fmt(t.odds_ratio) << ", " << Percent(confidence) << " profile CI " << FmtCi(t.ci) << ", LR X^2 = "
      << Fmt(t.statistic) << " on 1 df, " << PEquals(t.p) << ".";
  }
  return o.str();
}

std::string EffectTestSentence(const EffectTest& t, double alpha) {
  const std::string& name = t.label.empty() ? t.name : t.label;
  if (!t.estimable) return name + ": not estimable by the conditional model (" + t.note + ").";
  std::ostringstream o;
  o << name << ": the likelihood-ratio test " << Verb(t.p, alpha) << " the hypothesis of no effect at alpha " << Fmt(alpha)
    << ": X^2 = " << Fmt(t.statistic) << " on " << t.df << " df, " << PEquals(t.p) << ".";
  return o.str();
}

std::string RenderKLevelText(const AnalysisResult& r) {
  const KLevelAnalysis& k = r.k_levels;
  if (!k.present) return "";
  std::ostringstream o;
  for (const FactorAnalysis& f : k.factors) {
    // Records are groups of real applications, not levels a plan varied.
    if (r.records)
      o << "\nFactor " << f.label << " (groups of applications), positive outcome by group:\n";
    else
      o << "\nFactor " << f.label << " (" << (f.within ? "varied within sets" : "varied between vacancies or unpaired")
        << "), positive callback by level:\n";
    for (const LevelRate& l : f.levels) {
      char line[160];
      const std::string shown = LevelShown(l);
      std::snprintf(line, sizeof line, "  %s %6lld / %-6lld %7s\n", PadRight(shown, 20).c_str(), static_cast<long long>(l.positive),
                    static_cast<long long>(l.probes), FormatPercent(l.rate).c_str());
      o << line;
    }
    if (const std::string s = OverallSentence(f, r.alpha, r.records); !s.empty()) o << Wrap(s, "  ");
    if (const std::string s = VacancyTestSentence(f, r.alpha); !s.empty()) o << Wrap(s, "  ");
    if (!f.pairwise.empty()) {
      const bool blocks = f.overall && !f.overall->blocks_by.empty();
      o << (r.records ? "  Every pair of groups (" : "  Every pair of levels (")
        << (!f.within ? "Fisher's exact test"
            : blocks  ? "exact McNemar on the blocks of one set and one level of " + f.overall->blocks_by
                      : "exact McNemar on the sets holding both")
        << "; p adjusted by " << r.effects.correction << " over the " << Count(static_cast<int64_t>(f.pairwise.size()), "pair", "pairs")
        << "):\n";
      for (const LevelPair& p : f.pairwise) PairText(o, p, f.label, r.confidence);
    }
    if (const std::string s = TrendSentence(f, r.alpha, r.confidence); !s.empty()) o << Wrap(s, "  ");
  }
  const TwoFactorModel& m = k.model;
  if (m.present) {
    o << "\nTwo factors: conditional logistic regression on the sets (exact conditional likelihood, "
      << Count(m.sets, "informative set", "informative sets") << "):\n";
    if (!m.failure.empty()) {
      o << "  the model could not be fitted: " << m.failure << ".\n";
      return o.str();
    }
    for (const EffectTest& t : m.tests) o << Wrap(EffectTestSentence(t, r.alpha), "  ");
    for (const ModelTerm& t : m.terms)
      o << "  odds ratio " << t.label << " = " << Fmt(t.odds_ratio) << ", " << Percent(r.confidence) << " profile CI "
        << FmtCi(t.ci) << " (Wald " << PEquals(t.p_wald) << ")\n";
  }
  return o.str();
}

nlohmann::json KLevelJson(const KLevelAnalysis& k) {
  nlohmann::json j;
  j["present"] = k.present;
  j["factors"] = nlohmann::json::array();
  for (const FactorAnalysis& f : k.factors) {
    nlohmann::json fj{{"name", f.name}, {"label", f.label}, {"vary", f.within ? "within" : "between"}};
    fj["levels"] = nlohmann::json::array();
    for (const LevelRate& l : f.levels)
      fj["levels"].push_back({{"level", l.level}, {"label", l.label}, {"probes", l.probes}, {"positive", l.positive}, {"rate", JsonNumber(l.rate)}});
    if (f.overall) {
      const OverallTest& t = *f.overall;
      fj["overall"] = {{"test", t.method == "cochran_q" ? "Cochran's Q" : "Pearson chi-square on the k x 2 table"},
                       {"statistic", JsonNumber(t.statistic)},
                       {"df", t.df},
                       {"p_asymptotic", JsonNumber(t.p_asymptotic)},
                       {"p_exact", t.p_exact ? JsonNumber(*t.p_exact) : nlohmann::json(nullptr)},
                       {"exact_test", t.method == "cochran_q" ? "permutation within sets" : "Freeman-Halton"},
                       {"p", JsonNumber(t.p())}};
      if (t.method == "cochran_q") {
        fj["overall"]["sets"] = t.sets;
        fj["overall"]["informative_sets"] = t.informative_sets;
        if (!t.blocks_by.empty()) fj["overall"]["blocks_by"] = t.blocks_by;
      } else {
        fj["overall"]["min_expected"] = JsonNumber(t.min_expected);
      }
    }
    fj["pairwise"] = nlohmann::json::array();
    for (const LevelPair& p : f.pairwise) {
      nlohmann::json pj{{"first", p.first},           {"second", p.second},
                        {"first_label", p.first_label}, {"second_label", p.second_label},
                        {"rate_first", JsonNumber(p.rate_first)}, {"rate_second", JsonNumber(p.rate_second)},
                        {"difference", JsonNumber(p.difference)}, {"test", p.paired ? "exact McNemar" : "Fisher exact"},
                        {"p", JsonNumber(p.p)},           {"p_adjusted", JsonNumber(p.p_adjusted)}};
      if (p.paired) {
        pj["table"] = {{"a", p.pairs.a}, {"b", p.pairs.b}, {"c", p.pairs.c}, {"d", p.pairs.d}, {"n", p.pairs.n()}};
        pj["net_discrimination_among_positive"] = {{"estimate", JsonNumber(p.net.among_positive.estimate)},
                                                   {"conf_int", Ci(p.net.among_positive.ci)}};
        pj["paired_difference"] = {{"estimate", JsonNumber(p.net.over_all.estimate)}, {"conf_int", Ci(p.net.over_all.ci)}};
        pj["conditional_odds_ratio"] = {{"estimate", JsonNumber(p.conditional_or.estimate)},
                                        {"conf_int", Ci(p.conditional_or.ci)}};
      }
      fj["pairwise"].push_back(pj);
    }
    if (f.vacancy_test.present) {
      const VacancyPermutationTest& t = f.vacancy_test;
      fj["vacancy_test"] = {{"test", "permutation of levels among vacancies within the plan's blocks"},
                            {"statistic", JsonNumber(t.statistic)},
                            {"vacancies", t.vacancies},
                            {"blocks", t.blocks},
                            {"vacancies_by_level", t.vacancies_by_level},
                            {"positive_by_level", t.positive_by_level},
                            {"resamples", t.resamples},
                            {"p", JsonNumber(t.p)},
                            {"monte_carlo_se", JsonNumber(t.monte_carlo_se)}};
    }
    if (f.trend.present) {
      const TrendResult& t = f.trend;
      fj["trend"] = {{"test", t.method == "cochran_armitage" ? "Cochran-Armitage" : "conditional logistic slope"},
                     {"scores", t.scores},
                     {"defined", t.defined},
                     {"statistic", JsonNumber(t.statistic)},
                     {"df", 1},
                     {"p", JsonNumber(t.p)}};
      if (t.method == "cochran_armitage") fj["trend"]["z"] = JsonNumber(t.z);
      else {
        fj["trend"]["slope"] = JsonNumber(t.slope);
        fj["trend"]["odds_ratio_per_unit"] = JsonNumber(t.odds_ratio);
        fj["trend"]["conf_int"] = Ci(t.ci);
      }
      if (!t.note.empty()) fj["trend"]["note"] = t.note;
    }
    j["factors"].push_back(fj);
  }
  if (k.model.present) {
    nlohmann::json mj{{"method", "conditional logistic regression (exact conditional likelihood)"},
                      {"informative_sets", k.model.sets}};
    if (!k.model.failure.empty()) mj["failure"] = k.model.failure;
    mj["tests"] = nlohmann::json::array();
    for (const EffectTest& t : k.model.tests) {
      nlohmann::json tj{{"effect", t.name}, {"label", t.label}, {"estimable", t.estimable}};
      if (t.estimable) {
        tj["lr_statistic"] = JsonNumber(t.statistic);
        tj["df"] = t.df;
        tj["p"] = JsonNumber(t.p);
      } else {
        tj["note"] = t.note;
      }
      mj["tests"].push_back(tj);
    }
    mj["terms"] = nlohmann::json::array();
    for (const ModelTerm& t : k.model.terms)
      mj["terms"].push_back({{"term", t.name},
                             {"label", t.label},
                             {"coefficient", JsonNumber(t.coefficient)},
                             {"standard_error", JsonNumber(t.standard_error)},
                             {"odds_ratio", JsonNumber(t.odds_ratio)},
                             {"conf_int", Ci(t.ci)},
                             {"p_wald", JsonNumber(t.p_wald)}});
    j["two_factor_model"] = mj;
  }
  return j;
}

}  // namespace twinprobe
