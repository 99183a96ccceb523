#include "analysis/adjusted_model.h"

#include <algorithm>
#include <cmath>
#include <set>

#include "stats/clogit.h"
#include "stats/pvalue.h"

namespace twinprobe {

AdjustedModel FitAdjustedModel(const std::vector<std::vector<LaidOutProbe>>& sets,
                               const std::vector<std::string>& arm_labels, double confidence) {
  AdjustedModel m;
  std::set<std::string> templates;
  std::set<int> positions;
  bool matched = false;
  for (const auto& s : sets) {
    matched = matched || s.size() > 1;
    for (const LaidOutProbe& p : s) {
      templates.insert(p.template_path);
      positions.insert(p.send_order);
    }
  }
  if (!matched || arm_labels.size() < 2) return m;
  m.present = true;
  stats::MatchedSetsData d;
  std::vector<std::string> kinds;
  for (size_t a = 1; a < arm_labels.size(); ++a) {
    d.names.push_back("arm: " + arm_labels[a]);
    kinds.push_back("arm");
  }
  const size_t arms = d.names.size();
  // Baselines: the first template and the first position (sorted).
  const std::vector<std::string> tlist(templates.begin(), templates.end());
  const std::vector<int> plist(positions.begin(), positions.end());
  for (size_t t = 1; t < tlist.size(); ++t) {
    d.names.push_back("template: " + tlist[t]);
    kinds.push_back("template");
  }
  for (size_t p = 1; p < plist.size(); ++p) {
    d.names.push_back("send position " + std::to_string(plist[p]));
    kinds.push_back("position");
  }
  long set_id = 0;
  for (const auto& s : sets) {
    for (const LaidOutProbe& p : s) {
      std::vector<double> x;
      for (size_t a = 1; a < arm_labels.size(); ++a) x.push_back(p.arm == static_cast<int>(a) ? 1.0 : 0.0);
      for (size_t t = 1; t < tlist.size(); ++t) x.push_back(p.template_path == tlist[t] ? 1.0 : 0.0);
      for (size_t q = 1; q < plist.size(); ++q) x.push_back(p.send_order == plist[q] ? 1.0 : 0.0);
      d.set.push_back(set_id);
      d.x.push_back(std::move(x));
      d.outcome.push_back(p.positive ? 1 : 0);
    }
    ++set_id;
  }
  stats::ClogitFit fit = stats::FitClogit(d);
  // A group confounded with the arms makes the columns dependent: leave out
  // send position, then template, and say so.
  for (const char* group : {"position", "template"}) {
    if (fit.status != stats::FitStatus::kSingular) break;
    std::vector<size_t> keep;
    for (size_t j = 0; j < kinds.size(); ++j)
      if (kinds[j] != group) keep.push_back(j);
    if (keep.size() == kinds.size()) continue;
    m.left_out.push_back(std::string(group) == "position" ? "send position" : "template");
    stats::MatchedSetsData reduced = d;
    reduced.names.clear();
    std::vector<std::string> reduced_kinds;
    for (size_t j : keep) {
      reduced.names.push_back(d.names[j]);
      reduced_kinds.push_back(kinds[j]);
    }
    for (size_t i = 0; i < d.x.size(); ++i) {
      reduced.x[i].clear();
      for (size_t j : keep) reduced.x[i].push_back(d.x[i][j]);
    }
    d = std::move(reduced);
    kinds = std::move(reduced_kinds);
    fit = stats::FitClogit(d);
  }
  m.sets = fit.sets;
  if (!fit.ok()) {
    m.failure = fit.message;
    return m;
  }
  for (size_t j = 0; j < d.names.size(); ++j) {
    AdjustedTerm t;
    t.name = d.names[j];
    t.kind = kinds[j];
    t.coefficient = fit.coefficients[j];
    t.standard_error = fit.standard_errors[j];
    t.odds_ratio = std::exp(t.coefficient);
    t.p_wald = fit.p_wald[j];
    const stats::Interval ci = stats::ClogitProfileInterval(d, fit, static_cast<int>(j), confidence);
    t.ci = {std::exp(ci.low), std::exp(ci.high)};
    m.terms.push_back(t);
  }
  m.nuisance_df = static_cast<int>(d.names.size() - arms);
  if (m.nuisance_df > 0) {
    stats::MatchedSetsData reduced = d;
    reduced.names.resize(arms);
    for (auto& row : reduced.x) row.resize(arms);
    const stats::ClogitFit arms_only = stats::FitClogit(reduced);
    if (arms_only.ok()) {
      m.nuisance_lr = std::max(0.0, 2 * (fit.log_likelihood - arms_only.log_likelihood));
      m.nuisance_p = stats::ChiSquareUpper(m.nuisance_lr, m.nuisance_df).p;
    }
  }
  return m;
}

}  // namespace twinprobe
