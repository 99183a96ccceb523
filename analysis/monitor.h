#pragma once
// Interim monitoring of a paired study: a group-sequential exact McNemar test
// with Lan–DeMets alpha spending (stats/sequential.h). Pure: works on the
// complete sets in completion order (core/fieldwork.h, CompletedSet) and on
// the looks already taken (core/monitor_looks.h).
//
// How looks are defined: sets are ordered by the time they completed (ties
// by vacancy), and a look analyses the first s completed sets with their
// current outcomes. Information at a look is s / (planned sets), 1 at the
// final analysis; the exact boundaries use the discordant counts actually
// observed among those sets. The completion order depends only on sending
// times, never on outcomes, so looking does not steer which sets a look sees.
//
// Looks are records (issue 16): a look taken once is stored with its
// boundary and decision and is never taken again. A new look is due when a
// planned look's sets have completed, when asked for now (--look-now) with
// more sets complete than at the last look, or at the final analysis. Its
// boundary spends only the alpha the stored looks left
// (stats::ContinueSequentialBoundaries). After a stored stop or final look
// no look is added: the decision stands.
#include <cstdint>
#include <string>
#include <vector>

#include "core/fieldwork.h"
#include "core/monitor_looks.h"
#include "stats/sequential.h"

namespace twinprobe {

struct MonitorInput {
  std::vector<CompletedSet> completed;  // in completion order; sets of two probes count (arm 0 = reference)
  int64_t planned_sets = 0;
  std::vector<int> looks;  // planned interim looks, in completed sets
  double alpha = 0.05;
  stats::Spending spending = stats::Spending::kOBrienFleming;
  bool look_now = false;            // add an unplanned look at the sets completed now
  bool final_now = false;           // the sets completed now are the final analysis
  std::vector<StoredLook> stored;   // looks taken before, in order (core/monitor_looks.h)
};

struct MonitorLook {
  int64_t sets = 0;
  bool planned = true;
  bool final = false;
  int64_t b = 0, c = 0;  // reference only / other only among the look's sets
  bool stored = false;   // taken before this run (true in `reached` for stored looks)
  std::string Kind() const { return final ? "final" : planned ? "planned" : "unplanned"; }
};

struct MonitorResult {
  int64_t completed_sets = 0;
  std::vector<MonitorLook> schedule;             // every look, taken, due or still ahead
  std::vector<MonitorLook> reached;              // looks taken (stored first, then those taken now)
  std::vector<stats::SequentialBoundary> bounds;  // one per reached look
  int stopped = -1;       // index into reached of the look that crossed, -1 if none
  size_t shown = 0;       // looks to show: up to the stop, if any
  std::string decision;   // stop | final | continue | waiting | nothing_complete (--final with no set complete)
  int64_t next_look = 0;  // sets at the next look (0 when none is due)
  double adjusted_p = -1; // stage-wise adjusted p at a stop or the final look; -1 otherwise
  std::vector<StoredLook> new_looks;  // the looks taken now, to be stored (taken_at left empty)
};

// Requires 0 < alpha < 1.
MonitorResult RunMonitor(const MonitorInput& input);

// The stored looks as boundaries (for the stage-wise p-value and repeated
// intervals after a stop).
std::vector<stats::SequentialBoundary> StoredBoundaries(const std::vector<StoredLook>& looks);

}  // namespace twinprobe
