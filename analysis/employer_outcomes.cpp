#include "analysis/employer_outcomes.h"

#include <algorithm>

#include "core/store.h"

namespace twinprobe {

EmployerOutcomes SummariseEmployers(Store& store, const std::map<int64_t, stats::PairedCounts>& pairs) {
  EmployerOutcomes out;
  if (pairs.empty()) return out;
  std::map<std::string, EmployerOutcome> by_key;
  Stmt q = store.Prepare("SELECT employer_key FROM vacancy WHERE id = ?1");
  for (const auto& [vacancy_id, one] : pairs) {
    q.Bind(1, vacancy_id);
    const bool found = q.Step() && !q.IsNull(0);
    const std::string key = found ? q.Text(0) : "";
    q.Reset();
    if (key.empty()) continue;  // imported pairs may carry no employer
    EmployerOutcome& e = by_key[key];
    e.pseudonym = key;
    ++e.vacancies;
    e.table.a += one.a, e.table.b += one.b, e.table.c += one.c, e.table.d += one.d;
  }
  out.available = !by_key.empty();
  out.employers = static_cast<int64_t>(by_key.size());
  for (auto& [key, e] : by_key) {
    e.discordant = e.table.discordant();
    if (e.discordant > 0) out.discordant.push_back(e);
  }
  out.employers_discordant = static_cast<int64_t>(out.discordant.size());
  std::stable_sort(out.discordant.begin(), out.discordant.end(),
                   [](const EmployerOutcome& x, const EmployerOutcome& y) { return x.discordant > y.discordant; });
  return out;
}

}  // namespace twinprobe
