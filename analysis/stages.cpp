#include "analysis/stages.h"

#include <algorithm>

#include "stats/adjust.h"

namespace twinprobe {

HiringStages ComputeHiringStages(const std::vector<std::string>& stages, const std::vector<std::string>& arm_labels,
                                 const std::vector<StageCodeCount>& counts, const std::string& correction,
                                 double confidence) {
  HiringStages h;
  auto method = stats::ParseAdjustment(correction).value_or(stats::Adjustment::kNone);
  h.correction = stats::AdjustmentName(method);
  if (stages.empty() || arm_labels.size() < 2) return h;
  h.present = true;
  // furthest[arm][k]: applications whose furthest stage is k.
  std::vector<std::vector<int64_t>> furthest(arm_labels.size(), std::vector<int64_t>(stages.size(), 0));
  for (const StageCodeCount& c : counts) {
    auto arm = std::find(arm_labels.begin(), arm_labels.end(), c.arm);
    auto stage = std::find(stages.begin(), stages.end(), c.code);
    if (arm == arm_labels.end()) continue;
    if (stage == stages.end()) {
      h.unknown_outcomes += c.applications;
      continue;
    }
    furthest[static_cast<size_t>(arm - arm_labels.begin())][static_cast<size_t>(stage - stages.begin())] += c.applications;
  }
  // reached[arm][k]: at stage k or beyond (a suffix sum).
  std::vector<std::vector<int64_t>> reached(arm_labels.size(), std::vector<int64_t>(stages.size() + 1, 0));
  for (size_t a = 0; a < arm_labels.size(); ++a)
    for (size_t k = stages.size(); k-- > 0;) reached[a][k] = reached[a][k + 1] + furthest[a][k];
  for (size_t k = 0; k < stages.size(); ++k) {
    HiringStage s;
    s.name = stages[k];
    for (size_t a = 0; a < arm_labels.size(); ++a)
      s.groups.push_back({arm_labels[a], reached[a][k], reached[a][k == 0 ? 0 : k - 1], reached[a][0]});
    if (k > 0)
      for (size_t a = 1; a < arm_labels.size(); ++a) {
        StageTest t;
        t.other_label = arm_labels[a];
        const StageGroup &ref = s.groups[0], &other = s.groups[a];
        stats::Table2x2 all{ref.reached, ref.applications - ref.reached, other.reached, other.applications - other.reached};
        stats::Table2x2 prev{ref.reached, ref.previous - ref.reached, other.reached, other.previous - other.reached};
        t.among_all = stats::FisherTest(all, stats::Alternative::kTwoSided, confidence);
        t.among_previous = stats::FisherTest(prev, stats::Alternative::kTwoSided, confidence);
        s.tests.push_back(t);
      }
    h.stages.push_back(std::move(s));
  }
  // One family per comparison and count, across the stages.
  for (size_t a = 0; a + 1 < arm_labels.size(); ++a) {
    std::vector<double> all, prev;
    for (size_t k = 1; k < h.stages.size(); ++k) {
      all.push_back(h.stages[k].tests[a].among_all.p.p);
      prev.push_back(h.stages[k].tests[a].among_previous.p.p);
    }
    auto all_adj = stats::AdjustP(all, method), prev_adj = stats::AdjustP(prev, method);
    for (size_t k = 1; k < h.stages.size(); ++k) {
      h.stages[k].tests[a].among_all_adjusted = all_adj[k - 1];
      h.stages[k].tests[a].among_previous_adjusted = prev_adj[k - 1];
    }
  }
  return h;
}

}  // namespace twinprobe
