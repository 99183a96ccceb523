#pragma once
// Hiring stages: when each application's outcome is the furthest stage it
// reached (`import applications --stages applied,screened,interview,offer,
// hire`), the selection rate of each group at every stage after the first,
// counted two ways:
//   among all applicants:       reached this stage / applications;
//   among the previous stage's: reached this stage / reached the previous
//                               stage (who passed this step).
// Each other group is compared with the reference group by Fisher's exact
// test, two-sided (stats/fisher.h; R's fisher.test on the 2x2 table of
// reference / other by reached / not reached). The p values of one count and
// one comparison across the stages form a family, adjusted with the design's
// correction (R's p.adjust).
#include <cstdint>
#include <string>
#include <vector>

#include "core/stage_counts.h"
#include "stats/fisher.h"

namespace twinprobe {

struct StageGroup {
  std::string label;
  int64_t reached = 0;   // applications at this stage or beyond
  int64_t previous = 0;  // at the previous stage or beyond
  int64_t applications = 0;
};

struct StageTest {
  std::string other_label;
  stats::FisherResult among_all, among_previous;
  double among_all_adjusted = 1, among_previous_adjusted = 1;
};

struct HiringStage {
  std::string name;
  std::vector<StageGroup> groups;  // in arm order, reference first
  std::vector<StageTest> tests;    // one per other arm (none for the first stage)
};

struct HiringStages {
  bool present = false;
  std::string correction;  // as applied ("none" when the design says none)
  std::vector<HiringStage> stages;
  int64_t unknown_outcomes = 0;  // applications whose code is no stage (not counted)
};

// `arm_labels`: reference first. Requires 0 < confidence < 1. Without
// stages or arms, returns present = false.
HiringStages ComputeHiringStages(const std::vector<std::string>& stages, const std::vector<std::string>& arm_labels,
                                 const std::vector<StageCodeCount>& counts, const std::string& correction,
                                 double confidence);

}  // namespace twinprobe
