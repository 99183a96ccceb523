#include "analysis/employer_sets.h"

#include <algorithm>
#include <map>

namespace twinprobe {

EmployerSetsSummary SummariseEmployerSets(const std::vector<EmployerSets>& sets, size_t arms) {
  EmployerSetsSummary out;
  std::map<std::string, EmployerSetRow> by_key;  // sorted by pseudonym
  for (const EmployerSets& s : sets) {
    if (s.probes.size() < 3) continue;
    EmployerSetRow& row = by_key[s.employer_key];
    row.pseudonym = s.employer_key;
    row.positive.resize(arms, 0);
    row.sets += s.count;
    size_t positives = 0;
    for (const SetProbe& p : s.probes) {
      if (!p.positive) continue;
      ++positives;
      if (static_cast<size_t>(p.arm) < arms) row.positive[static_cast<size_t>(p.arm)] += s.count;
    }
    if (positives > 0 && positives < s.probes.size()) row.unequal += s.count;
  }
  out.available = !by_key.empty();
  out.employers = static_cast<int64_t>(by_key.size());
  for (const auto& [key, row] : by_key)
    if (row.unequal > 0) out.unequal_rows.push_back(row);
  out.employers_unequal = static_cast<int64_t>(out.unequal_rows.size());
  std::stable_sort(out.unequal_rows.begin(), out.unequal_rows.end(),
                   [](const EmployerSetRow& x, const EmployerSetRow& y) { return x.unequal > y.unequal; });
  return out;
}

}  // namespace twinprobe
