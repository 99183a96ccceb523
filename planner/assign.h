#pragma once
// Assignment of profiles, templates, send order and send times to vacancies.
// Deterministic from the design's seed: the same design and vacancies give
// the same plan, byte for byte.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "planner/vacancies.h"

namespace twinprobe {

struct PlannedProfile {
  int arm = 0;
  std::string given_name;
  std::string family_name;
  std::string mailbox;
  std::string phone;
  std::string full_name() const { return given_name + " " + family_name; }
};

struct PlannedProbe {
  int vacancy = 0;   // index into the vacancies
  int arm = 0;       // index into design.arms
  int profile = 0;   // index into Plan::profiles
  int template_index = 0;
  int send_order = 1;  // 1 = sent first within its set
  int64_t planned_at = 0;  // UTC seconds
};

struct Plan {
  std::vector<PlannedProfile> profiles;
  std::vector<PlannedProbe> probes;  // grouped by set, in send order
};

// A name pool: the names one level may use.
struct NameList {
  std::vector<std::pair<std::string, std::string>> names;  // given, family
};

// Reads the design's name pools (CSV with given_name, family_name).
Result<std::vector<NameList>> ReadNamePools(const std::string& study_dir, const Design& design);

// Builds the plan. Each template carries each arm equally often within each
// stratum block (rotation, differences of at most one); which arm goes first
// is balanced within each block and otherwise random; gaps are drawn from the
// design's range; no two probes of one set share a template or a name, and no
// name is used twice at one employer. Fails when the cap per employer would
// be exceeded or a pool is too small to avoid reuse at an employer.
Result<Plan> AssignProbes(const Design& design, const std::vector<Vacancy>& vacancies,
                          const std::vector<NameList>& pools);

}  // namespace twinprobe
