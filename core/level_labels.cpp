#include "core/level_labels.h"

namespace twinprobe {

std::string LevelDisplay(const LevelLabels& labels, const std::string& level) {
  const auto it = labels.find(level);
  return it == labels.end() || it->second.empty() ? level : it->second;
}

LevelLabels LevelLabelsOf(const std::vector<std::string>& levels, const std::vector<std::string>& labels) {
  LevelLabels out;
  for (size_t i = 0; i < levels.size() && i < labels.size(); ++i)
    if (!labels[i].empty()) out.emplace(levels[i], labels[i]);
  return out;
}

std::string ArmDisplay(std::string_view arm_label, const std::map<std::string, LevelLabels>& by_factor) {
  std::string out;
  bool any = false;
  size_t start = 0;
  while (start <= arm_label.size()) {
    const size_t comma = arm_label.find(',', start);
    const std::string_view part = arm_label.substr(start, comma == std::string_view::npos ? std::string_view::npos : comma - start);
    const size_t eq = part.find('=');
    std::string shown(eq == std::string_view::npos ? part : part.substr(eq + 1));
    if (eq != std::string_view::npos)
      if (const auto f = by_factor.find(std::string(part.substr(0, eq))); f != by_factor.end())
        shown = LevelDisplay(f->second, shown);
    out += (any ? ", " : "") + shown;
    any = true;
    if (comma == std::string_view::npos) break;
    start = comma + 1;
  }
  return out.empty() ? std::string(arm_label) : out;
}

}  // namespace twinprobe
