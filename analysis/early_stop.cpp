#include "analysis/early_stop.h"

#include "analysis/monitor.h"
#include "stats/mcnemar.h"
#include "stats/paired.h"
#include "stats/paired_repeated_ci.h"
#include "stats/sequential.h"

namespace twinprobe {

EarlyStop ComputeEarlyStop(const std::vector<StoredLook>& looks) {
  EarlyStop e;
  size_t stop = looks.size();
  for (size_t k = 0; k < looks.size(); ++k)
    if (looks[k].decision == "stop" && looks[k].kind != "final") {
      stop = k;
      break;
    }
  if (stop == looks.size()) return e;
  const StoredLook& l = looks[stop];
  e.present = true;
  e.look = l.look;
  e.sets = l.sets;
  e.planned_sets = l.planned_sets;
  e.taken_at = l.taken_at;
  e.b = l.reference_only;
  e.c = l.other_only;
  e.alpha = l.alpha;
  e.spending = l.spending;
  const stats::PairedCounts t{0, l.reference_only, l.other_only, 0};
  e.naive_p = stats::McNemarExactP(t);
  e.naive_conf = 1 - l.alpha;
  const stats::Estimate naive = stats::ConditionalOddsRatio(t, e.naive_conf);
  e.naive_odds_ratio = naive.estimate;
  e.naive_lower = naive.ci.low;
  e.naive_upper = naive.ci.high;
  // The stored boundaries, as they were set: the stage-wise p-value walks them.
  const std::vector<StoredLook> taken(looks.begin(), looks.begin() + static_cast<std::ptrdiff_t>(stop) + 1);
  e.stagewise_p = stats::StagewisePValue(StoredBoundaries(taken), stop, l.reference_only);
  std::vector<stats::DiscordantCounts> counts;
  std::vector<double> information;
  for (const StoredLook& s : taken) {
    counts.push_back({s.reference_only, s.other_only});
    information.push_back(s.information);
  }
  stats::Spending spending = stats::Spending::kOBrienFleming;
  stats::ParseSpending(l.spending, spending);
  const auto rci = stats::RepeatedConfidenceIntervals(counts, information, l.alpha, spending);
  e.repeated_conf = rci.back().nominal_conf;
  e.repeated_lower = rci.back().odds_ratio.ci.low;
  e.repeated_upper = rci.back().odds_ratio.ci.high;
  return e;
}

std::string EarlyStopCaution() {
  return "The naive p-value and interval treat the stopping look as a study of fixed size; the study stopped because "
         "the data looked extreme at a look it chose among several, so they overstate the evidence, and the "
         "stage-wise p-value and repeated interval allow for the looks.";
}

}  // namespace twinprobe
