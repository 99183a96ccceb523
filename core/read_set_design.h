#pragma once
// The current plan set by set, as the analyses of several levels and factors
// need it: for every vacancy its between levels and, per probe in send
// order, the arm, the levels of every factor, the template and the send
// position. Plain values; memory grows with the probes (about 200 bytes
// each), so read it only when per-probe detail is needed (the counted
// fieldwork, core/fieldwork.h, serves the paired analyses).
#include <cstdint>
#include <map>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct SetProbeDesign {
  int64_t probe_id = 0;
  std::string probe_ref;
  int64_t arm_id = 0;
  std::string arm_label;
  std::map<std::string, std::string> levels;  // factor -> level, every factor
  std::string template_path;                  // "" when the plan has no templates
  int send_order = 1;                         // 1 = sent first within its set
};

struct PlannedSetDesign {
  int64_t vacancy_id = 0;
  std::string vacancy_ref;
  // The levels of the factors varied between vacancies ({} without them):
  // those every probe of the set shares.
  std::map<std::string, std::string> between;
  std::vector<SetProbeDesign> probes;  // in send order
};

// Every set of the current plan in vacancy order; empty without a plan.
std::vector<PlannedSetDesign> ReadSetDesigns(Store& store);

}  // namespace twinprobe
