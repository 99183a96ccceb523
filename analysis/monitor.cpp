#include "analysis/monitor.h"

#include <algorithm>

#include "stats/mcnemar.h"

namespace twinprobe {

std::vector<stats::SequentialBoundary> StoredBoundaries(const std::vector<StoredLook>& looks) {
  std::vector<stats::SequentialBoundary> out;
  for (const StoredLook& l : looks) {
    stats::SequentialBoundary bd;
    bd.information = l.information;
    bd.n_discordant = l.discordant;
    bd.lower = l.lower;
    bd.alpha_allowed = l.alpha_allowed;
    bd.alpha_spent = l.alpha_spent;
    out.push_back(bd);
  }
  return out;
}

MonitorResult RunMonitor(const MonitorInput& in) {
  MonitorResult m;
  // Only sets of two probes enter a paired test.
  std::vector<const CompletedSet*> completed;
  for (const CompletedSet& s : in.completed)
    if (s.probes.size() == 2) completed.push_back(&s);
  const int64_t done = static_cast<int64_t>(completed.size());
  m.completed_sets = done;
  if (done == 0 && in.final_now && in.stored.empty()) {
    m.decision = "nothing_complete";
    return m;
  }
  auto counted = [&](MonitorLook l) {
    for (int64_t i = 0; i < l.sets && i < done; ++i) {
      bool ref = false, other = false;
      for (const SetProbe& p : completed[static_cast<size_t>(i)]->probes) (p.arm == 0 ? ref : other) |= p.positive;
      if (ref && !other) ++l.b;
      if (other && !ref) ++l.c;
    }
    return l;
  };

  // The looks already taken, as they were recorded.
  for (const StoredLook& s : in.stored)
    m.reached.push_back({s.sets, s.kind == "planned" || (s.kind == "final" && s.sets == s.planned_sets),
                         s.kind == "final", s.reference_only, s.other_only, true});
  const bool ended = std::any_of(in.stored.begin(), in.stored.end(),
                                 [](const StoredLook& s) { return s.decision != "continue"; });
  const int64_t last_sets = in.stored.empty() ? 0 : in.stored.back().sets;

  // The schedule: the looks taken, planned interim looks still ahead, then the
  // final analysis at all planned sets.
  std::vector<int> planned_looks = in.looks;
  std::sort(planned_looks.begin(), planned_looks.end());
  planned_looks.erase(std::unique(planned_looks.begin(), planned_looks.end()), planned_looks.end());
  std::vector<MonitorLook> ahead;
  for (int s : planned_looks)
    if (s > last_sets && s < in.planned_sets) ahead.push_back({s, true, false, 0, 0, false});

  // Looks due now, in order.
  std::vector<MonitorLook> due;
  if (!ended) {
    if (in.final_now) {
      // Planned looks passed on the way are taken first, then the final one.
      for (const MonitorLook& l : ahead)
        if (l.sets < done) due.push_back(l);
      if (done > 0) due.push_back({done, done == in.planned_sets, true, 0, 0, false});
    } else {
      for (const MonitorLook& l : ahead)
        if (l.sets <= done) due.push_back(l);
      const int64_t last_due = due.empty() ? last_sets : due.back().sets;
      if (in.look_now && done > last_due && done < in.planned_sets) due.push_back({done, false, false, 0, 0, false});
      if (done >= in.planned_sets && in.planned_sets > last_sets) due.push_back({in.planned_sets, true, true, 0, 0, false});
    }
  }
  std::vector<stats::SequentialLook> seq;
  for (MonitorLook& l : due) {
    l = counted(l);
    seq.push_back({l.final ? 1.0 : static_cast<double>(l.sets) / static_cast<double>(in.planned_sets), l.b + l.c});
  }
  std::vector<stats::SequentialBoundary> all =
      stats::ContinueSequentialBoundaries(StoredBoundaries(in.stored), seq, in.alpha, in.spending);

  // A stored stop stands; among the new looks the first crossing ends the run.
  for (size_t k = 0; k < in.stored.size(); ++k)
    if (in.stored[k].decision == "stop") {
      m.stopped = static_cast<int>(k);
      break;
    }
  m.bounds.assign(all.begin(), all.begin() + static_cast<std::ptrdiff_t>(in.stored.size()));
  for (size_t i = 0; i < due.size() && m.stopped < 0; ++i) {
    const stats::SequentialBoundary& bd = all[in.stored.size() + i];
    const MonitorLook& l = due[i];
    m.reached.push_back(l);
    m.bounds.push_back(bd);
    const bool crossed = bd.crossed_by(l.b);
    if (crossed) m.stopped = static_cast<int>(m.reached.size() - 1);
    StoredLook s;
    s.look = static_cast<int64_t>(m.reached.size());
    s.kind = l.Kind();
    s.sets = l.sets;
    s.planned_sets = in.planned_sets;
    s.information = bd.information;
    s.discordant = bd.n_discordant;
    s.reference_only = l.b;
    s.other_only = l.c;
    s.lower = bd.lower;
    s.alpha = in.alpha;
    s.spending = stats::SpendingName(in.spending);
    s.alpha_allowed = bd.alpha_allowed;
    s.alpha_spent = bd.alpha_spent;
    s.decision = crossed ? "stop" : l.final ? "final" : "continue";
    m.new_looks.push_back(std::move(s));
  }

  // What is shown as the schedule: every look reached, then those ahead.
  m.schedule = m.reached;
  const bool final_reached = !m.reached.empty() && m.reached.back().final;
  if (m.stopped < 0 && !final_reached) {
    for (const MonitorLook& l : ahead)
      if (l.sets > done) m.schedule.push_back(l);
    if (!in.final_now) m.schedule.push_back({in.planned_sets, true, true, 0, 0, false});
  }
  m.decision = m.stopped >= 0 ? "stop" : final_reached ? "final" : m.reached.empty() ? "waiting" : "continue";
  if (m.stopped < 0 && !final_reached)
    for (const MonitorLook& l : m.schedule)
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
