#include "report/monitor_decision.h"

#include <algorithm>
#include <cstdio>
#include <sstream>

#include "report/p_value.h"

namespace twinprobe {
namespace {

std::string Alpha(double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%g", v);
  return buf;
}

}  // namespace

std::string MonitorDecisionText(const MonitorResult& m, double alpha, const std::string& reference_label,
                                const std::string& other_label) {
  std::ostringstream t;
  if (m.decision == "waiting") {
    t << "Decision: waiting. No look has been reached yet; the first is at " << m.next_look << " completed sets ("
      << m.completed_sets << " so far).\n";
  } else if (m.decision == "continue") {
    t << "Decision: continue. No boundary has been crossed. The next look is at " << m.next_look
      << " completed sets (" << m.completed_sets << " so far).\n";
  } else if (m.decision == "stop") {
    const MonitorLook& l = m.reached[static_cast<size_t>(m.stopped)];
    const bool ref = l.b > l.c;
    t << (l.final ? "Decision: the final analysis crosses the boundary. At look " : "Decision: stop. At look ")
      << m.stopped + 1 << " (" << l.sets << " completed sets) the " << (ref ? reference_label : other_label)
      << " arm alone was called back in " << std::max(l.b, l.c) << " of " << l.b + l.c
      << " discordant sets, crossing the boundary of " << m.bounds[static_cast<size_t>(m.stopped)].upper() << ".\n"
      << "Adjusted p-value (stage-wise ordering): " << FormatP(m.adjusted_p)
      << (l.final ? ". The study shows a difference at the planned overall alpha "
                  : ". The evidence so far shows a difference at the planned overall alpha ")
      << Alpha(alpha) << ".\n";
  } else {
    t << "Decision: final analysis reached without crossing a boundary: the study does not show a difference at\n"
      << "overall alpha " << Alpha(alpha) << ". Adjusted p-value (stage-wise ordering): " << FormatP(m.adjusted_p)
      << ".\n";
  }
  return t.str();
}

}  // namespace twinprobe
