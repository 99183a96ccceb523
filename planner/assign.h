#pragma once
// Assignment of profiles, templates, send order and send times to vacancies
// (docs/architecture.md, "planner"). Deterministic from the design's seed through
// stats::Rng only: the same design, vacancies and pools give the same plan,
// byte for byte.
//
// What it guarantees (tests/planner/assign_test.cpp checks each over many
// seeds and random designs):
//   - paired / sets: every vacancy gets one probe per arm of its set
//     (planner/set_groups.h: every arm, or with factors varied between
//     vacancies the arms of one between level, drawn by blocked
//     randomisation so each stratum block holds every between level equally
//     often, up to one); unpaired: one probe, its arm drawn within the
//     vacancy's stratum block;
//   - within each stratum block every template carries every arm equally
//     often, up to one (Latin-square rotation of templates over arms), and
//     over the whole plan too;
//   - send order: every arm holds every position equally often within each
//     block and over the plan, up to one (up to two for an odd number of
//     arms per set, whose orders come from a square and its mirror image), and every arm directly follows every other arm of its
//     set about equally often (Williams 1949: one balanced Latin square for
//     an even number k of arms per set; for odd k the square and its mirror
//     image, each row used as both equally often, up to one, per set group);
//   - no two probes of one set share a template; no name is used twice at one
//     employer; no employer gets more probes than [ethics].cap_per_employer;
//   - the first probe of a set goes at a random open minute of its sending
//     day ([schedule].sets_per_day sets per day, vacancy-file order); each
//     further probe at a random open minute gap_hours[0]..gap_hours[1] hours
//     after the previous one.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "planner/name_pools.h"
#include "planner/profiles.h"
#include "planner/vacancies.h"

namespace twinprobe {

struct PlannedProbe {
  int vacancy = 0;   // index into the vacancies
  int arm = 0;       // index into design.arms
  int profile = 0;   // index into Plan::profiles
  int template_index = 0;
  int send_order = 1;  // 1 = sent first within its set
  int64_t planned_at = 0;  // UTC seconds, a whole minute
};

struct Plan {
  std::vector<PlannedProfile> profiles;
  std::vector<PlannedProbe> probes;  // grouped by set (vacancy-file order), in send order
};

// Builds the plan. Fails (bad input, naming the vacancies file and line) when
// the cap per employer would be exceeded or a pool is too small to avoid
// reusing a name at an employer.
Result<Plan> AssignProbes(const Design& design, const std::vector<Vacancy>& vacancies,
                          const std::vector<NameList>& pools);

// The send-order square for k arms: row r lists the arm symbols in send
// order, row r = (0, 1, k-1, 2, k-2, …) + r mod k (Williams 1949). Every row
// and column is a permutation; for even k each symbol directly follows each
// other symbol exactly once.
std::vector<std::vector<int>> SendOrderSquare(int k);

// The send orders a plan draws from: the square for even k (k rows); for odd
// k >= 3 the square and then its mirror image (row k + r is row r reversed,
// 2k rows), in which each symbol directly follows each other symbol exactly
// twice (Williams 1949).
std::vector<std::vector<int>> WilliamsOrders(int k);

// The stratum block of a vacancy: its stratum values joined (the design's
// column order), "" without strata.
std::string StratumBlockKey(const Design& design, const Vacancy& vacancy);

}  // namespace twinprobe
