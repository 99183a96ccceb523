#include "analysis/monitor.h"

#include <algorithm>

#include "stats/mcnemar.h"

namespace twinprobe {

MonitorResult RunMonitor(const MonitorInput& in) {
  MonitorResult m;
  // Only sets of two probes enter a paired test.
  std::vector<const CompletedSet*> completed;
  for (const CompletedSet& s : in.completed)
    if (s.probes.size() == 2) completed.push_back(&s);
  const int64_t done = static_cast<int64_t>(completed.size());
  m.completed_sets = done;
  if (done == 0 && in.final_now) {
    m.decision = "nothing_complete";
    return m;
  }

  // The schedule: planned interim looks below the planned total, then the
  // final analysis at all planned sets (or now, with final_now).
  std::vector<MonitorLook>& schedule = m.schedule;
  std::vector<int> planned_looks = in.looks;
  std::sort(planned_looks.begin(), planned_looks.end());
  planned_looks.erase(std::unique(planned_looks.begin(), planned_looks.end()), planned_looks.end());
  for (int s : planned_looks)
    if (s > 0 && s < in.planned_sets) schedule.push_back({s, true, false, 0, 0});
  if (in.final_now) {
    std::erase_if(schedule, [&](const MonitorLook& l) { return l.sets >= done; });
    schedule.push_back({done, false, true, 0, 0});
  } else {
    if (in.look_now && done > 0 && done < in.planned_sets &&
        std::none_of(schedule.begin(), schedule.end(), [&](const MonitorLook& l) { return l.sets == done; })) {
      schedule.push_back({done, false, false, 0, 0});
      std::sort(schedule.begin(), schedule.end(),
                [](const MonitorLook& a, const MonitorLook& b) { return a.sets < b.sets; });
    }
    schedule.push_back({in.planned_sets, true, true, 0, 0});
  }

  // Counts at each reached look.
  std::vector<stats::SequentialLook> seq;
  for (MonitorLook l : schedule) {
    if (l.sets > done) break;
    for (int64_t i = 0; i < l.sets; ++i) {
      bool ref = false, other = false;
      for (const SetProbe& p : completed[static_cast<size_t>(i)]->probes) (p.arm == 0 ? ref : other) |= p.positive;
      if (ref && !other) ++l.b;
      if (other && !ref) ++l.c;
    }
    m.reached.push_back(l);
    seq.push_back({l.final ? 1.0 : static_cast<double>(l.sets) / static_cast<double>(in.planned_sets), l.b + l.c});
  }
  m.bounds = stats::ExactSequentialBoundaries(seq, in.alpha, in.spending);
  for (size_t k = 0; k < m.reached.size(); ++k)
    if (m.bounds[k].crossed_by(m.reached[k].b)) {
      m.stopped = static_cast<int>(k);
      break;
    }
  const bool final_reached = !m.reached.empty() && m.reached.back().final;
  m.decision = m.stopped >= 0 ? "stop" : final_reached ? "final" : m.reached.empty() ? "waiting" : "continue";
  if (m.stopped < 0 && !final_reached)
    for (const MonitorLook& l : schedule)
      if (l.sets > done) {
        m.next_look = l.sets;
        break;
      }
  m.shown = m.stopped >= 0 ? static_cast<size_t>(m.stopped) + 1 : m.reached.size();
  if (m.stopped >= 0)
    m.adjusted_p = stats::StagewisePValue(m.bounds, static_cast<size_t>(m.stopped), m.reached[static_cast<size_t>(m.stopped)].b);
  else if (final_reached)
    m.adjusted_p = stats::StagewisePValue(m.bounds, m.reached.size() - 1, m.reached.back().b);
  return m;
}

}  // namespace twinprobe
