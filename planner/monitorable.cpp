#include "planner/monitorable.h"

#include <algorithm>

namespace twinprobe {

std::string MonitorRefusal(const Design& d) {
  const std::string can = "monitor can only watch a paired design (two arms, a set of two probes per vacancy)";
  if (d.kind != "paired") return can + " and this design is '" + d.kind + "'";
  // A paired design with a between factor has two probes per vacancy but
  // more than two arms: no single McNemar test covers it.
  auto between = std::find_if(d.factors.begin(), d.factors.end(), [](const Factor& f) { return f.is_between(); });
  if (between != d.factors.end())
    return can + " and this design has " + std::to_string(d.arms.size()) + " arms, because factor '" +
           between->name + "' varies between vacancies";
  return "";
}

}  // namespace twinprobe
