#include "planner/design_words.h"

#include "core/level_labels.h"

namespace twinprobe {

std::string DescribeVariation(const Design& d) {
  std::string strata;
  for (size_t i = 0; i < d.strata.size(); ++i)
    strata += (i == 0 ? "" : i + 1 == d.strata.size() ? " and " : ", ") + d.strata[i];
  const std::string balanced = strata.empty() ? "balanced over the plan" : "balanced within " + strata;
  std::string out;
  for (const Factor& f : d.factors) {
    // Display labels, when the design gives them, name the factor and its
    // levels: the code stays beside the factor's label.
    std::string levels = std::to_string(f.levels.size()) + " levels";
    if (!f.labels.empty())
      for (size_t i = 0; i < f.levels.size(); ++i) levels += (i ? ", " : ": ") + f.LevelLabel(f.levels[i]);
    const std::string name = f.label.empty() ? f.name : f.label + " (" + f.name + ")";
    out += out.empty() ? "" : "; ";
    if (f.is_between() || d.kind == "unpaired")
      out += name + " is assigned between vacancies (" + levels + ", " + balanced + ")";
    else
      out += name + " varies within each vacancy (" + levels + ")";
  }
  return out;
}

std::string DescribeArmLabels(const Design& d) {
  bool labelled = false;
  for (const Factor& f : d.factors) labelled = labelled || !f.labels.empty();
  if (!labelled) return "";
  std::map<std::string, LevelLabels> by_factor;
  for (const Factor& f : d.factors) by_factor.emplace(f.name, f.labels);
  std::string out = "Arms by their display labels:";
  for (size_t a = 0; a < d.arms.size(); ++a) out += (a ? "; " : " ") + d.arms[a].label + " = " + ArmDisplay(d.arms[a].label, by_factor);
  return out + ".";
}

}  // namespace twinprobe
