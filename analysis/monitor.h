#pragma once
// Interim monitoring of a paired study: a group-sequential exact McNemar test
// with Lan–DeMets alpha spending (stats/sequential.h). Pure: works on the
// complete sets in completion order (core/fieldwork.h, CompletedSet).
//
// How looks are defined: a set completes at the time of its last sending (for
// a probe never marked sent, the time of its response); sets are ordered by
// that time (ties by vacancy), and look k analyses the first s_k completed
// sets with their current outcomes, s_k being the planned looks plus the
// final analysis at all planned sets. Information at look k is
// s_k / (planned sets); the exact boundaries use the discordant counts
// actually observed among those sets. The completion order depends only on
// sending times, never on outcomes, so looking does not steer which sets a
// look sees.
#include <cstdint>
#include <string>
#include <vector>

#include "core/fieldwork.h"
#include "stats/sequential.h"

namespace twinprobe {

struct MonitorInput {
  std::vector<CompletedSet> completed;  // in completion order; sets of two probes count (arm 0 = reference)
  int64_t planned_sets = 0;
  std::vector<int> looks;  // planned interim looks, in completed sets
  double alpha = 0.05;
  stats::Spending spending = stats::Spending::kOBrienFleming;
  bool look_now = false;   // add an unplanned look at the sets completed now
  bool final_now = false;  // the sets completed now are the final analysis
};

struct MonitorLook {
  int64_t sets = 0;
  bool planned = true;
  bool final = false;
  int64_t b = 0, c = 0;  // reference only / other only among the look's sets
};

struct MonitorResult {
  int64_t completed_sets = 0;
  std::vector<MonitorLook> schedule;             // every look, reached or not
  std::vector<MonitorLook> reached;              // looks reached, with counts
  std::vector<stats::SequentialBoundary> bounds;  // one per reached look
  int stopped = -1;       // index into reached of the look that crossed, -1 if none
  size_t shown = 0;       // looks to show: up to the stop, if any
  std::string decision;   // stop | final | continue | waiting | nothing_complete (--final with no set complete)
  int64_t next_look = 0;  // sets at the next look (0 when none is due)
  double adjusted_p = -1; // stage-wise adjusted p at a stop or the final look; -1 otherwise
};

// Requires planned_sets >= completed sets of two probes, 0 < alpha < 1.
MonitorResult RunMonitor(const MonitorInput& input);

}  // namespace twinprobe
