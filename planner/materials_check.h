#pragma once
// Materials belong to one plan. A field worker sends the files in
// materials/; after a new plan those files may hold another arm's profile
// (issue 16: P00001.md still held the inland applicant while the new plan
// made P00001 the coastal one). So:
//  - `plan` moves the materials of an older plan aside, and
//  - `schedule` and `sent` refuse a probe whose file on disk is not the one
//    `render` sealed for the current plan (one check, CheckProbeMaterial).
#include <cstdint>
#include <optional>
#include <string>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// Ok when the probe is not in the current plan (the caller says so), when the study was never rendered (it sends by other means), or when
// every file sealed for `probe_ref` of the current plan is on disk with the
// sealed SHA-256. Otherwise names the file and `render` as the fix.
Status CheckProbeMaterial(Store& store, const std::string& study_dir, const std::string& probe_ref);

// How render records the output folder: relative to the study folder when
// inside it (the study may move), else absolute.
std::string MaterialFolderForStore(const std::string& study_dir, const std::string& out_dir);

struct SupersededMove {
  int64_t old_plan = 0;
  int64_t files = 0;
  std::string to;  // the folder they went to
};

// After plan `new_plan` was stored: moves the files of STUDY/materials (not
// its folders) to STUDY/materials/superseded-plan-N, N being the plan its
// manifest names (else `previous_plan`). Nothing to move (no manifest.csv)
// gives nullopt.
Result<std::optional<SupersededMove>> MoveSupersededMaterials(const std::string& study_dir,
                                                             std::optional<int64_t> previous_plan);

}  // namespace twinprobe
