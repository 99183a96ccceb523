#pragma once
// The one rule for a level's display text, and an arm's built from it: a
// level shows its display label (`labels = { "28" = "aged 28" }` in the
// design file, stored with the plan) when it has one, else the level code
// itself. Used by the design file's Factor (plan, check), the stored
// factors (analysis, report) and the design in words.
#include <map>
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

// level -> display label (a level missing or labelled "" shows as itself).
using LevelLabels = std::map<std::string, std::string>;

// The display text of `level`: its label in `labels`, else `level`.
std::string LevelDisplay(const LevelLabels& labels, const std::string& level);

// The map of parallel lists (the store keeps levels and labels side by
// side; a label "" means none).
LevelLabels LevelLabelsOf(const std::vector<std::string>& levels, const std::vector<std::string>& labels);

// The display text of an arm label ("age=45,gender=f" -> "aged 45, f"):
// each "factor=level" part through LevelDisplay with that factor's labels
// in `by_factor` (factor name -> its labels), joined by ", " in the label's
// order; a part without '=' shows as it is. An empty result gives the label.
std::string ArmDisplay(std::string_view arm_label, const std::map<std::string, LevelLabels>& by_factor);

}  // namespace twinprobe
