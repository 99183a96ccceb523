#include "analysis/k_level.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "stats/adjust.h"
#include "stats/cochran_q.h"
#include "stats/k_by_two.h"
#include "stats/mcnemar.h"
#include "stats/pairwise.h"
#include "stats/pvalue.h"
#include "stats/trend.h"

namespace twinprobe {

std::string LevelOfArm(const std::string& label, const std::string& factor) {
  // A label without '=' is an arm of a study of one factor, named by its
  // level (imported records: "a28", whatever --factor calls the factor).
  if (label.find('=') == std::string::npos) return label;
  size_t start = 0;
  while (start <= label.size()) {
    const size_t comma = label.find(',', start);
    const std::string part = label.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    const size_t eq = part.find('=');
    if (eq != std::string::npos && part.substr(0, eq) == factor) return part.substr(eq + 1);
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  return "";
}

namespace {

// The display texts the caller put in the factor (empty: the codes).
std::string FactorLabel(const KLevelFactor& f) { return f.label.empty() ? f.name : f.label; }
std::string LevelLabelAt(const KLevelFactor& f, size_t i) {
  return i < f.level_labels.size() && !f.level_labels[i].empty() ? f.level_labels[i] : f.levels[i];
}

// Level index of every arm for one factor (-1 when the label lacks it).
std::vector<int> ArmLevels(const KLevelInput& in, const KLevelFactor& f) {
  std::vector<int> out;
  for (const auto& label : in.arm_labels) {
    const std::string level = LevelOfArm(label, f.name);
    auto it = std::find(f.levels.begin(), f.levels.end(), level);
    out.push_back(it == f.levels.end() ? -1 : static_cast<int>(it - f.levels.begin()));
  }
  return out;
}

// Expands the shapes into rows of level outcomes, the blocks Cochran's Q
// and McNemar's test need: one row per set and combination of the other
// factors' levels (`others`, arm -> level per other factor), holding exactly
// one probe of every level. With one factor, or the others varied between
// vacancies, that is one row per set; with a second factor varied within
// sets, a set of age x gender gives one row of ages per gender. Under the
// null hypothesis the levels are exchangeable within each such block, which
// is what the permutation distribution of Q (Cochran 1950) conditions on,
// whatever the blocks of one set share (docs/methods.md, "Two factors both
// within").
std::vector<std::vector<int>> WithinRows(const KLevelInput& in, const std::vector<int>& arm_level, size_t k,
                                         const std::vector<std::vector<int>>& others) {
  std::vector<std::vector<int>> rows;
  for (const SetOutcome& s : in.sets) {
    std::map<std::vector<int>, std::vector<int>> blocks;  // other levels -> row
    std::set<std::vector<int>> broken;
    for (const auto& [arm, positive] : s.probes) {
      std::vector<int> key;
      for (const auto& other : others) key.push_back(other[static_cast<size_t>(arm)]);
      std::vector<int>& row = blocks.try_emplace(key, std::vector<int>(k, -1)).first->second;
      const int level = arm_level[static_cast<size_t>(arm)];
      if (level < 0 || row[static_cast<size_t>(level)] >= 0) broken.insert(key);
      else row[static_cast<size_t>(level)] = positive ? 1 : 0;
    }
    for (const auto& [key, row] : blocks) {
      if (broken.count(key) || std::find(row.begin(), row.end(), -1) != row.end()) continue;
      for (int64_t i = 0; i < s.count; ++i) rows.push_back(row);
    }
  }
  return rows;
}

// One conditional logistic regression row per probe of every set, each
// set expanded `count` times; `columns(arm)` gives the covariates.
template <typename Columns>
stats::MatchedSetsData SetsData(const KLevelInput& in, std::vector<std::string> names, Columns columns) {
  stats::MatchedSetsData d;
  d.names = std::move(names);
  long set_id = 0;
  for (const SetOutcome& s : in.sets)
    for (int64_t i = 0; i < s.count; ++i, ++set_id)
      for (const auto& [arm, positive] : s.probes) {
        d.set.push_back(set_id);
        d.x.push_back(columns(arm));
        d.outcome.push_back(positive ? 1 : 0);
      }
  return d;
}

TrendResult ClogitSlope(const KLevelInput& in, const KLevelFactor& f, const std::vector<int>& arm_level) {
  TrendResult t;
  t.present = true;
  t.method = "clogit_slope";
  t.scores = f.scores;
  auto d = SetsData(in, {f.name}, [&](int arm) {
    const int level = arm_level[static_cast<size_t>(arm)];
    return std::vector<double>{level < 0 ? 0.0 : f.scores[static_cast<size_t>(level)]};
  });
  const stats::ClogitFit fit = stats::FitClogit(d);
  if (!fit.ok()) {
    t.note = fit.message;
    return t;
  }
  t.defined = true;
  t.slope = fit.coefficients[0];
  t.odds_ratio = std::exp(t.slope);
  t.statistic = fit.lr_statistic;
  t.p = fit.lr_p;
  t.z = fit.z[0];
  const stats::Interval log_ci = stats::ClogitProfileInterval(d, fit, 0, in.confidence);
  t.ci = {std::exp(log_ci.low), std::exp(log_ci.high)};
  return t;
}

LevelPair FromPairwise(const stats::PairwiseComparison& c, const KLevelFactor& f, bool paired) {
  LevelPair p;
  p.paired = paired;
  p.first = f.levels[static_cast<size_t>(c.first)];
  p.second = f.levels[static_cast<size_t>(c.second)];
  p.first_label = LevelLabelAt(f, static_cast<size_t>(c.first));
  p.second_label = LevelLabelAt(f, static_cast<size_t>(c.second));
  p.rate_first = c.rate_first;
  p.rate_second = c.rate_second;
  p.difference = c.difference;
  p.p = c.p;
  p.p_adjusted = c.p_adjusted;
  return p;
}

FactorAnalysis AnalyzeFactor(const KLevelInput& in, const KLevelFactor& f, stats::Adjustment method) {
  FactorAnalysis fa;
  fa.name = f.name;
  fa.label = FactorLabel(f);
  const size_t k = f.levels.size();
  const std::vector<int> arm_level = ArmLevels(in, f);
  std::vector<int64_t> probes(k, 0), positive(k, 0);
  fa.within = false;
  for (const SetOutcome& s : in.sets) {
    std::set<int> seen;
    for (const auto& [arm, pos] : s.probes) {
      const int level = arm_level[static_cast<size_t>(arm)];
      if (level < 0) continue;
      seen.insert(level);
      probes[static_cast<size_t>(level)] += s.count;
      if (pos) positive[static_cast<size_t>(level)] += s.count;
    }
    if (seen.size() > 1) fa.within = true;
  }
  if (in.kind == "unpaired") fa.within = false;
  for (size_t i = 0; i < k; ++i)
    fa.levels.push_back({f.levels[i], LevelLabelAt(f, i), probes[i], positive[i],
                         probes[i] ? static_cast<double>(positive[i]) / static_cast<double>(probes[i]) : 0.0});
  const bool scored = f.scores.size() == k;
  std::vector<std::vector<int>> others;
  std::vector<std::string> other_within;  // display texts of the other factors varied within sets
  for (const KLevelFactor& other : in.factors) {
    if (other.name == f.name) continue;
    others.push_back(ArmLevels(in, other));
    std::set<int> held;
    bool within = false;
    for (const SetOutcome& s : in.sets) {
      held.clear();
      for (const auto& probe : s.probes) held.insert(others.back()[static_cast<size_t>(probe.first)]);
      within = within || held.size() > 1;
    }
    if (within) other_within.push_back(FactorLabel(other));
  }
  if (fa.within) {
    const auto rows = WithinRows(in, arm_level, k, others);
    if (rows.empty()) return fa;
    const stats::CochranQ q = stats::CochranQTest(rows);
    OverallTest o;
    o.method = "cochran_q";
    o.sets = q.sets;
    o.informative_sets = q.informative_sets;
    o.statistic = q.statistic;
    o.df = q.df;
    o.p_asymptotic = q.p_asymptotic;
    o.p_exact = q.p_exact;
    for (const std::string& other : other_within)
      o.blocks_by += (o.blocks_by.empty() ? "" : " and ") + other;
    fa.overall = o;
    for (const auto& c : stats::PairwiseWithin(rows, method)) {
      LevelPair p = FromPairwise(c, f, true);
      for (const auto& row : rows) {
        const int x = row[static_cast<size_t>(c.first)], y = row[static_cast<size_t>(c.second)];
        (x ? (y ? p.pairs.a : p.pairs.b) : (y ? p.pairs.c : p.pairs.d)) += 1;
      }
      p.net = stats::NetDiscriminationRates(p.pairs, in.confidence);
      p.conditional_or = stats::ConditionalOddsRatio(p.pairs, in.confidence);
      fa.pairwise.push_back(p);
    }
    if (scored) fa.trend = ClogitSlope(in, f, arm_level);
    return fa;
  }
  if (in.kind != "unpaired") {
    // 99,999 re-assignments, fewer for a large study so the work stays
    // near 5e7 vacancy visits (at least 9,999: Monte Carlo SE <= 0.005).
    int64_t vacancies = 0;
    for (const SetOutcome& s : in.sets) vacancies += s.count;
    const int64_t resamples = std::clamp<int64_t>(50'000'000 / std::max<int64_t>(1, vacancies), 9'999, 99'999);
    fa.vacancy_test = TestByVacancy(in.sets, arm_level, k, others, in.seed, resamples);
  }
  if (std::any_of(probes.begin(), probes.end(), [](int64_t n) { return n == 0; })) return fa;
  const stats::KByTwoTest kt = stats::KByTwo(positive, probes);
  OverallTest o;
  o.method = "chi_square";
  o.statistic = kt.chi2;
  o.df = kt.df;
  o.p_asymptotic = kt.p_chi2;
  o.p_exact = kt.p_exact;
  o.min_expected = kt.min_expected;
  fa.overall = o;
  for (const auto& c : stats::PairwiseBetween(positive, probes, method)) fa.pairwise.push_back(FromPairwise(c, f, false));
  if (scored) {
    const stats::TrendTest tt = stats::CochranArmitage(positive, probes, f.scores);
    fa.trend.present = true;
    fa.trend.method = "cochran_armitage";
    fa.trend.scores = f.scores;
    fa.trend.defined = tt.defined;
    fa.trend.statistic = tt.statistic;
    fa.trend.z = tt.z;
    fa.trend.p = tt.p;
    if (!tt.defined) fa.trend.note = "every probe has the same outcome";
  }
  return fa;
}

// Columns of the two-factor model: indicators of each factor's
// non-reference levels (only for factors varied within sets) and the
// products of the two factors' indicators.
struct ModelColumns {
  std::vector<std::string> names;
  std::vector<std::string> labels;  // the names with display texts
  std::vector<std::vector<double>> by_arm;  // arm -> columns
  std::vector<int> main_a, main_b, interaction;  // column indices
};

ModelColumns BuildColumns(const KLevelInput& in, const KLevelFactor& a, const KLevelFactor& b, bool a_within,
                          bool b_within) {
  ModelColumns m;
  const std::vector<int> la = ArmLevels(in, a), lb = ArmLevels(in, b);
  const size_t arms = in.arm_labels.size();
  m.by_arm.assign(arms, {});
  auto ref_index = [](const KLevelFactor& f) {
    auto it = std::find(f.levels.begin(), f.levels.end(), f.reference);
    return it == f.levels.end() ? 0 : static_cast<int>(it - f.levels.begin());
  };
  const int ra = ref_index(a), rb = ref_index(b);
  auto add = [&](const std::string& name, const std::string& label, std::vector<int>& group, auto value) {
    group.push_back(static_cast<int>(m.names.size()));
    m.names.push_back(name);
    m.labels.push_back(label);
    for (size_t arm = 0; arm < arms; ++arm) m.by_arm[arm].push_back(value(arm));
  };
  for (int i = 0; i < static_cast<int>(a.levels.size()); ++i)
    if (i != ra && a_within)
      add(a.name + "=" + a.levels[static_cast<size_t>(i)], LevelLabelAt(a, static_cast<size_t>(i)), m.main_a, [&](size_t arm) { return la[arm] == i ? 1.0 : 0.0; });
  for (int j = 0; j < static_cast<int>(b.levels.size()); ++j)
    if (j != rb && b_within)
      add(b.name + "=" + b.levels[static_cast<size_t>(j)], LevelLabelAt(b, static_cast<size_t>(j)), m.main_b, [&](size_t arm) { return lb[arm] == j ? 1.0 : 0.0; });
  for (int i = 0; i < static_cast<int>(a.levels.size()); ++i)
    for (int j = 0; j < static_cast<int>(b.levels.size()); ++j)
      if (i != ra && j != rb)
        add(a.name + "=" + a.levels[static_cast<size_t>(i)] + " x " + b.name + "=" + b.levels[static_cast<size_t>(j)],
            LevelLabelAt(a, static_cast<size_t>(i)) + " x " + LevelLabelAt(b, static_cast<size_t>(j)), m.interaction, [&](size_t arm) { return la[arm] == i && lb[arm] == j ? 1.0 : 0.0; });
  return m;
}

// The data with only `keep` columns.
stats::MatchedSetsData Select(const stats::MatchedSetsData& d, const std::vector<int>& keep) {
  stats::MatchedSetsData s;
  s.set = d.set;
  s.outcome = d.outcome;
  for (int c : keep) s.names.push_back(d.names[static_cast<size_t>(c)]);
  for (const auto& row : d.x) {
    std::vector<double> r;
    for (int c : keep) r.push_back(row[static_cast<size_t>(c)]);
    s.x.push_back(std::move(r));
  }
  return s;
}

// Log likelihood of the model with `keep` columns; with none, the null
// model's (every coefficient 0).
std::optional<double> LogLikelihood(const stats::MatchedSetsData& d, const std::vector<int>& keep, double ll_null,
                                    std::string& failure) {
  if (keep.empty()) return ll_null;
  const stats::MatchedSetsData s = Select(d, keep);
  const stats::ClogitFit fit = stats::FitClogit(s);
  if (!fit.ok()) {
    failure = fit.message;
    return std::nullopt;
  }
  return fit.log_likelihood;
}

EffectTest LrTest(const std::string& name, const std::string& label, double ll_full, double ll_reduced, int df) {
  EffectTest t;
  t.name = name;
  t.label = label;
  t.df = df;
  t.statistic = std::max(0.0, 2 * (ll_full - ll_reduced));
  t.p = df > 0 ? stats::ChiSquareUpper(t.statistic, df).p : 1.0;
  return t;
}

void AddTerms(TwoFactorModel& model, const stats::MatchedSetsData& d, const std::vector<std::string>& labels,
              const std::vector<int>& keep, const std::vector<int>& report, double conf) {
  const stats::MatchedSetsData s = Select(d, keep);
  const stats::ClogitFit fit = stats::FitClogit(s);
  if (!fit.ok()) return;
  for (size_t j = 0; j < keep.size(); ++j) {
    if (std::find(report.begin(), report.end(), keep[j]) == report.end()) continue;
    ModelTerm t;
    t.name = s.names[j];
    t.label = labels[static_cast<size_t>(keep[j])];
    t.coefficient = fit.coefficients[j];
    t.standard_error = fit.standard_errors[j];
    t.odds_ratio = std::exp(t.coefficient);
    t.p_wald = fit.p_wald[j];
    const stats::Interval ci = stats::ClogitProfileInterval(s, fit, static_cast<int>(j), conf);
    t.ci = {std::exp(ci.low), std::exp(ci.high)};
    model.terms.push_back(t);
  }
}

TwoFactorModel FitTwoFactors(const KLevelInput& in, const FactorAnalysis& fa, const FactorAnalysis& fb) {
  TwoFactorModel model;
  model.present = true;
  const KLevelFactor& a = in.factors[0];
  const KLevelFactor& b = in.factors[1];
  const ModelColumns m = BuildColumns(in, a, b, fa.within, fb.within);
  const auto d = SetsData(in, m.names, [&](int arm) { return m.by_arm[static_cast<size_t>(arm)]; });
  std::vector<int> main_cols = m.main_a;
  main_cols.insert(main_cols.end(), m.main_b.begin(), m.main_b.end());
  std::vector<int> full = main_cols;
  full.insert(full.end(), m.interaction.begin(), m.interaction.end());
  const stats::ClogitFit full_fit = stats::FitClogit(Select(d, full));
  model.sets = full_fit.sets;
  if (!full_fit.ok()) {
    model.failure = full_fit.message;
    return model;
  }
  std::string failure;
  const auto ll_main = LogLikelihood(d, main_cols, full_fit.log_likelihood_null, failure);
  auto main_effect = [&](const KLevelFactor& f, const FactorAnalysis& analysis, const std::vector<int>& own,
                         const std::vector<int>& other) {
    if (!analysis.within) {
      EffectTest t;
      t.name = f.name;
      t.label = FactorLabel(f);
      t.estimable = false;
      t.note = "varied between vacancies, so constant within every set: tested by re-assigning its levels to vacancies";
      return t;
    }
    const auto ll_reduced = LogLikelihood(d, other, full_fit.log_likelihood_null, failure);
    if (!ll_main || !ll_reduced) {
      EffectTest t;
      t.name = f.name;
      t.label = FactorLabel(f);
      t.estimable = false;
      t.note = failure;
      return t;
    }
    return LrTest(f.name, FactorLabel(f), *ll_main, *ll_reduced, static_cast<int>(own.size()));
  };
  model.tests.push_back(main_effect(a, fa, m.main_a, m.main_b));
  model.tests.push_back(main_effect(b, fb, m.main_b, m.main_a));
  if (ll_main) {
    model.tests.push_back(LrTest(a.name + " x " + b.name, FactorLabel(a) + " x " + FactorLabel(b), full_fit.log_likelihood, *ll_main,
                                 static_cast<int>(m.interaction.size())));
  } else {
    EffectTest t;
    t.name = a.name + " x " + b.name;
    t.label = FactorLabel(a) + " x " + FactorLabel(b);
    t.estimable = false;
    t.note = failure;
    model.tests.push_back(t);
  }
  if (!main_cols.empty()) AddTerms(model, d, m.labels, main_cols, main_cols, in.confidence);
  AddTerms(model, d, m.labels, full, m.interaction, in.confidence);
  return model;
}

}  // namespace

KLevelAnalysis AnalyzeKLevels(const KLevelInput& in) {
  KLevelAnalysis out;
  KLevelInput input = in;
  if (input.factors.empty()) {
    KLevelFactor arm{"arm", input.arm_labels, input.arm_labels.empty() ? "" : input.arm_labels[0], {}, "", {}};
    input.factors.push_back(arm);
  }
  const bool many_levels = std::any_of(input.factors.begin(), input.factors.end(),
                                       [](const KLevelFactor& f) { return f.levels.size() >= 3; });
  if (!many_levels && input.factors.size() < 2) return out;
  if (input.arm_labels.size() < 2) return out;
  out.present = true;
  const auto method = stats::ParseAdjustment(input.correction).value_or(stats::Adjustment::kNone);
  for (const auto& f : input.factors) out.factors.push_back(AnalyzeFactor(input, f, method));
  if (input.factors.size() == 2 && input.kind != "unpaired" && (out.factors[0].within || out.factors[1].within))
    out.model = FitTwoFactors(input, out.factors[0], out.factors[1]);
  return out;
}

}  // namespace twinprobe
