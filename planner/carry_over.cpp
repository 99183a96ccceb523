#include "planner/carry_over.h"

#include <algorithm>

#include "planner/set_groups.h"

namespace twinprobe {

CarryOverBalance ComputeCarryOver(const Design& d, const Plan& plan) {
  CarryOverBalance b;
  if (d.kind == "unpaired" || d.arms.empty()) return b;
  b.present = true;
  const size_t A = d.arms.size();
  for (const auto& a : d.arms) b.arms.push_back(a.label);
  b.first.assign(A, 0);
  b.after.assign(A, std::vector<int64_t>(A, 0));
  b.possible.assign(A, std::vector<bool>(A, false));
  const auto groups = SetGroups(d);
  for (const auto& g : groups)
    for (int x : g.arms)
      for (int y : g.arms)
        if (x != y) b.possible[static_cast<size_t>(x)][static_cast<size_t>(y)] = true;

  // Probes come grouped by set, in send order.
  for (size_t i = 0; i < plan.probes.size(); ++i) {
    const PlannedProbe& p = plan.probes[i];
    if (i == 0 || plan.probes[i - 1].vacancy != p.vacancy) {
      ++b.first[static_cast<size_t>(p.arm)];
      continue;
    }
    ++b.after[static_cast<size_t>(p.arm)][static_cast<size_t>(plan.probes[i - 1].arm)];
    ++b.pairs;
  }

  std::vector<int64_t> observed;
  std::vector<double> expected;
  for (const auto& g : groups) {
    std::vector<int64_t> cells;
    for (int x : g.arms)
      for (int y : g.arms)
        if (x != y) cells.push_back(b.after[static_cast<size_t>(x)][static_cast<size_t>(y)]);
    int64_t total = 0;
    for (int64_t c : cells) total += c;
    if (cells.empty()) continue;
    auto [lo, hi] = std::minmax_element(cells.begin(), cells.end());
    b.max_spread = std::max(b.max_spread, *hi - *lo);
    if (total == 0) continue;  // sets of this group were never planned
    for (int64_t c : cells) {
      observed.push_back(c);
      expected.push_back(static_cast<double>(total) / static_cast<double>(cells.size()));
    }
  }
  int tested_groups = 0;
  for (const auto& g : groups) {
    int64_t total = 0;
    for (int x : g.arms)
      for (int y : g.arms)
        if (x != y) total += b.after[static_cast<size_t>(x)][static_cast<size_t>(y)];
    tested_groups += total > 0;
  }
  if (!observed.empty()) b.test = stats::PearsonGoodnessOfFit(observed, expected, tested_groups);
  return b;
}

}  // namespace twinprobe
