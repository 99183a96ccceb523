#pragma once
// Hiring stages given as one yes/no column per stage (`import applications
// --stages applied,screened,...` when every stage names a column): the rule
// for a flag and the furthest stage a row reached. See docs/import.md.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/csv.h"
#include "core/status.h"

namespace twinprobe {

// One rule for every file: yes is 1, yes, y or true; no is 0, no, n or false
// (any case, spaces around allowed); anything else, an empty cell included,
// is none.
std::optional<bool> StageFlag(std::string_view cell);

// The index into `stage_names` of the last stage `record` flags yes.
// `stage_columns[k]` is the column of stage k (0-based); requires the
// record to hold every one. Refuses, at FILE:LINE:COL of the cell to fix, a
// cell that is neither yes nor no, a stage flagged yes after one flagged no
// (a stage is reached through every stage before it), and a row with no
// stage flagged yes.
Result<size_t> FurthestStage(const CsvRecord& record, const std::vector<int>& stage_columns,
                             const std::vector<std::string>& stage_names, const std::string& path);

}  // namespace twinprobe
