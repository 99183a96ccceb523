#pragma once
// After an early stop (issue 18): when the stored monitor looks
// (core/monitor_looks.h) show that a boundary was crossed before all planned
// sets completed, the naive fixed-sample p-value and interval overstate the
// evidence: the study stopped because the data looked extreme at that look,
// and a test that ignores the chance to stop at every look is too often
// significant. Beside them we give
//   - the stage-wise ordering p-value (Armitage 1957; Fairbanks & Madsen
//     1982; Jennison & Turnbull 2000, Group Sequential Methods with
//     Applications to Clinical Trials, §8.4): the probability under no
//     difference of stopping at an earlier look, plus that of reaching the
//     stopping look and being at least as extreme there
//     (stats::StagewisePValue on the stored boundaries);
//   - the repeated confidence interval of the conditional odds ratio b/c at
//     the stopping look (Jennison & Turnbull 1989, JRSS B 51:305-361; 2000,
//     ch. 9; stats::RepeatedConfidenceIntervals), which holds at every look
//     simultaneously with probability about 1 - alpha.
#include <cstdint>
#include <string>
#include <vector>

#include "core/monitor_looks.h"

namespace twinprobe {

struct EarlyStop {
  bool present = false;    // the stored looks show a stop
  int64_t look = 0;        // the look that stopped (1-based)
  int64_t sets = 0;        // completed sets at that look
  int64_t planned_sets = 0;
  std::string taken_at;
  int64_t b = 0, c = 0;    // reference only / other only at that look
  double alpha = 0.05;
  std::string spending;    // obf | pocock
  // Naive: as if the look's sets were a fixed-sample study.
  double naive_p = 1;            // exact McNemar, two-sided
  double naive_conf = 0.95;      // 1 - alpha
  double naive_odds_ratio = 0, naive_lower = 0, naive_upper = 0;
  // Adjusted for the looks.
  double stagewise_p = 1;
  double repeated_conf = 0;      // nominal level of the look's repeated interval
  double repeated_lower = 0, repeated_upper = 0;
};

// The early stop among `looks`, if one is stored (present = false otherwise,
// and when the stop was at the final look: a final analysis is not early).
EarlyStop ComputeEarlyStop(const std::vector<StoredLook>& looks);

// One sentence that says why the naive numbers overstate (text and HTML share it).
std::string EarlyStopCaution();

}  // namespace twinprobe
