#pragma once
// What `render` reads of the stored plan: each probe of the current plan with
// its vacancy, arm, template and profile fields. How materials are made of
// them is the planner's (planner/materials.h).
#include <optional>
#include <string>
#include <vector>

#include "core/store.h"

namespace twinprobe {

struct MaterialRow {
  std::string probe_ref;
  std::string vacancy_ref;
  std::string arm_label;
  int send_order = 1;
  std::string planned_at;                          // as stored
  std::string template_path;                       // "" when the plan has none
  std::optional<std::string> profile_fields_json;  // nullopt: the probe has no profile
};

// The current plan's probes by vacancy, send order, then id.
std::vector<MaterialRow> ReadMaterialRows(Store& store);

}  // namespace twinprobe
