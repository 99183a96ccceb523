#pragma once
// The sealed record of rendered materials (table material_file): which file
// `render` wrote for which probe of which plan, with its SHA-256. Whether a
// file on disk may be sent is the planner's rule (planner/materials_check.h).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/store.h"

namespace twinprobe {

// The current plan's id, or nullopt when the store holds no plan.
std::optional<int64_t> CurrentPlanId(Store& store);

struct MaterialFileInsert {
  std::string probe_ref;  // of the current plan
  std::string folder;     // relative to the study folder when inside it
  std::string file;       // P00001.md …
  std::string sha256;
};

// Appends one row per file under audit entry `seq` for the current plan.
// Throws StoreError when a probe is not in the current plan (render reads the
// probes from that plan in the same transaction, so only a bug gets there).
void WriteMaterialFiles(Store& store, int64_t seq, const std::vector<MaterialFileInsert>& rows);

struct ProbeMaterialFiles {
  bool probe_known = false;                   // the current plan has this probe
  std::optional<int64_t> last_rendered_plan;  // newest plan any render was for; nullopt: never rendered
  struct File {
    std::string folder, file, sha256;
  };
  std::vector<File> files;  // the newest row of each file name of the probe in the current plan
};

// What the store sealed about `probe_ref` of the current plan.
ProbeMaterialFiles ReadProbeMaterialFiles(Store& store, const std::string& probe_ref);

}  // namespace twinprobe
