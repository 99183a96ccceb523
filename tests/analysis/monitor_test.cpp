// Group-sequential monitoring (analysis/monitor.h) on completed sets built in
// memory. The boundaries themselves are tested in tests/stats/; here: which
// sets a look sees and what it decides.
#include <catch2/catch.hpp>

#include "analysis/monitor.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;

namespace {

// 'a' both positive, 'b' reference only, 'c' other only, 'd' neither.
std::vector<CompletedSet> Sets(const std::string& pattern) {
  std::vector<CompletedSet> out;
  for (size_t i = 0; i < pattern.size(); ++i) {
    const char k = pattern[i];
    out.push_back({static_cast<int64_t>(i + 1), static_cast<int64_t>(i),
                   {{0, true, true, k == 'a' || k == 'b'}, {1, true, true, k == 'a' || k == 'c'}}});
  }
  return out;
}

}  // namespace

TEST_CASE("monitor in memory: 40 of 48 discordant sets at the planned half-way look stop the study") {
  MonitorInput in;
  in.completed = Sets(std::string(40, 'b') + std::string(8, 'c') + std::string(152, 'd'));
  in.planned_sets = 400;
  in.looks = {200};
  const MonitorResult m = RunMonitor(in);
  CHECK(m.decision == "stop");
  CHECK(m.stopped == 0);
  CHECK(m.completed_sets == 200);
  REQUIRE(m.reached.size() == 1);
  CHECK(m.reached[0].b == 40);
  CHECK(m.reached[0].c == 8);
  // Independent recomputation from stats/sequential.h.
  auto bounds = stats::ExactSequentialBoundaries({{0.5, 48}}, 0.05, stats::Spending::kOBrienFleming);
  CHECK(m.bounds[0].upper() == bounds[0].upper());
  CHECK_THAT(m.adjusted_p, WithinRel(stats::StagewisePValue(bounds, 0, 40), 1e-12));
}

TEST_CASE("monitor in memory: a look counts the first sets to complete, and waits before the first look") {
  MonitorInput in;
  // 150 completed sets: the first 100 balanced, then 50 reference-only.
  in.completed = Sets(std::string(50, 'b') + std::string(50, 'c'));
  for (auto& s : Sets(std::string(50, 'b'))) in.completed.push_back(s);
  in.planned_sets = 400;
  in.looks = {100, 200};
  MonitorResult m = RunMonitor(in);
  CHECK(m.decision == "continue");
  REQUIRE(m.reached.size() == 1);
  CHECK(m.reached[0].b == 50);
  CHECK(m.reached[0].c == 50);
  CHECK(m.next_look == 200);

  in.completed.resize(99);
  m = RunMonitor(in);
  CHECK(m.decision == "waiting");
  CHECK(m.next_look == 100);
}

TEST_CASE("monitor in memory: --final with no complete set has nothing to analyse") {
  MonitorInput in;
  in.planned_sets = 10;
  in.final_now = true;
  CHECK(RunMonitor(in).decision == "nothing_complete");
}
