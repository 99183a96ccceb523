#include "planner/set_groups.h"

#include <algorithm>

namespace twinprobe {
namespace {

std::map<std::string, std::string> LevelsOf(const Design& d, const Arm& arm, bool between) {
  std::map<std::string, std::string> out;
  for (const auto& f : d.factors)
    if (f.is_between() == between) out[f.name] = arm.levels.at(f.name);
  return out;
}

}  // namespace

std::vector<SetGroup> SetGroups(const Design& d) {
  std::vector<SetGroup> groups;
  for (size_t a = 0; a < d.arms.size(); ++a) {
    auto between = LevelsOf(d, d.arms[a], true);
    auto it = std::find_if(groups.begin(), groups.end(), [&](const SetGroup& g) { return g.between == between; });
    if (it == groups.end()) it = groups.insert(groups.end(), SetGroup{between, {}});
    it->arms.push_back(static_cast<int>(a));
  }
  return groups;
}

std::string WithinLabel(const Design& d, const Arm& arm) {
  std::string label;
  for (const auto& [f, l] : LevelsOf(d, arm, false)) label += (label.empty() ? "" : ",") + f + "=" + l;
  return label;
}

}  // namespace twinprobe
