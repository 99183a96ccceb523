#include "analysis/vacancy_test.h"

#include <cmath>
#include <map>
#include <set>

#include "stats/permutation.h"

namespace twinprobe {

VacancyPermutationTest TestByVacancy(const std::vector<SetOutcome>& sets, const std::vector<int>& arm_level, size_t k,
                                     const std::vector<std::vector<int>>& other_levels, uint64_t seed,
                                     int64_t resamples) {
  VacancyPermutationTest t;
  std::vector<int32_t> level_of;       // per vacancy
  std::vector<double> positives_of;    // per vacancy
  std::map<std::string, std::vector<int32_t>> block_members;
  for (const SetOutcome& s : sets) {
    if (s.probes.empty()) continue;
    const int level = arm_level[static_cast<size_t>(s.probes.front().first)];
    bool one_level = level >= 0;
    int positive = 0;
    for (const auto& [arm, pos] : s.probes) {
      one_level = one_level && arm_level[static_cast<size_t>(arm)] == level;
      positive += pos ? 1 : 0;
    }
    if (!one_level) continue;
    // The block the plan randomised in: the strata values, and the levels
    // of the other factors that this set holds only one of (another factor
    // varied between vacancies).
    std::string key;
    for (const auto& [column, value] : s.strata) key += column + "=" + value + "\x1f";
    for (const auto& levels : other_levels) {
      std::set<int> held;
      for (const auto& probe : s.probes) held.insert(levels[static_cast<size_t>(probe.first)]);
      if (held.size() == 1) key += std::to_string(*held.begin()) + "\x1f";
    }
    for (int64_t i = 0; i < s.count; ++i) {
      block_members[key].push_back(static_cast<int32_t>(level_of.size()));
      level_of.push_back(level);
      positives_of.push_back(positive);
    }
  }
  std::vector<std::vector<int32_t>> blocks;
  for (auto& [key, members] : block_members) {
    std::set<int32_t> levels;
    for (int32_t v : members) levels.insert(level_of[static_cast<size_t>(v)]);
    if (levels.size() > 1) blocks.push_back(std::move(members));
  }
  t.vacancies = static_cast<int64_t>(level_of.size());
  t.blocks = static_cast<int64_t>(blocks.size());
  t.vacancies_by_level.assign(k, 0);
  t.positive_by_level.assign(k, 0);
  for (size_t v = 0; v < level_of.size(); ++v) {
    ++t.vacancies_by_level[static_cast<size_t>(level_of[v])];
    t.positive_by_level[static_cast<size_t>(level_of[v])] += static_cast<int64_t>(positives_of[v]);
  }
  if (blocks.empty()) return t;
  t.present = true;
  // n_j is the same under every re-assignment within blocks, so only S_j moves.
  const std::vector<int64_t> n = t.vacancies_by_level;
  auto statistic = [&](const std::vector<int32_t>& labels) {
    std::vector<double> sums(k, 0.0);
    for (size_t v = 0; v < labels.size(); ++v) sums[static_cast<size_t>(labels[v])] += positives_of[v];
    double total = 0;
    for (size_t j = 0; j < k; ++j)
      if (n[j] > 0) total += sums[j] * sums[j] / static_cast<double>(n[j]);
    return total;
  };
  stats::PermutationOptions options;
  options.resamples = resamples;
  options.seed = seed;
  const stats::PermutationResult r = stats::PermutationTest(level_of, blocks, statistic, stats::Tail::kGreater, options);
  t.statistic = r.observed;
  t.p = r.p_value;
  t.resamples = r.resamples;
  t.monte_carlo_se = std::sqrt(t.p * (1 - t.p) / static_cast<double>(r.resamples));
  return t;
}

}  // namespace twinprobe
