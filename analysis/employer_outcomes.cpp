#include "analysis/employer_outcomes.h"

#include <algorithm>

namespace twinprobe {

EmployerOutcomes SummariseEmployers(const std::vector<EmployerSets>& sets) {
  EmployerOutcomes out;
  std::map<std::string, EmployerOutcome> by_key;
  for (const EmployerSets& s : sets) {
    if (s.probes.size() != 2) continue;
    bool ref_pos = false, other_pos = false;
    for (const SetProbe& p : s.probes) (p.arm == 0 ? ref_pos : other_pos) = p.positive;
    EmployerOutcome& e = by_key[s.employer_key];
    e.pseudonym = s.employer_key;
    e.vacancies += s.count;
    (ref_pos ? (other_pos ? e.table.a : e.table.b) : (other_pos ? e.table.c : e.table.d)) += s.count;
  }
  out.available = !by_key.empty();
  out.employers = static_cast<int64_t>(by_key.size());
  for (auto& [key, e] : by_key) {
    e.discordant = e.table.discordant();
    if (e.vacancies > 1) ++out.employers_with_several;
    if (e.discordant > 0) out.discordant.push_back(e);
  }
  out.employers_discordant = static_cast<int64_t>(out.discordant.size());
  std::stable_sort(out.discordant.begin(), out.discordant.end(),
                   [](const EmployerOutcome& x, const EmployerOutcome& y) { return x.discordant > y.discordant; });
  return out;
}

void TestByEmployer(EmployerOutcomes& out, uint64_t seed, double pair_level_p, double alpha) {
  if (!out.available) return;
  // Employers without a discordant pair never change the statistic.
  std::vector<stats::DiscordantCounts> counts;
  for (const EmployerOutcome& e : out.discordant) counts.push_back({e.table.b, e.table.c});
  out.flip = stats::ClusterFlipTest(counts, seed);
  out.flip_tested = true;
  out.flip_disagrees = (out.flip.p_two_sided < alpha) != (pair_level_p < alpha);
}

}  // namespace twinprobe
