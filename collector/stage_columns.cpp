#include "collector/stage_columns.h"

#include "core/echoed_value.h"
#include "core/text.h"

namespace twinprobe {

std::optional<bool> StageFlag(std::string_view cell) {
  const std::string v = Lower(Trim(cell));
  if (v == "1" || v == "yes" || v == "y" || v == "true") return true;
  if (v == "0" || v == "no" || v == "n" || v == "false") return false;
  return std::nullopt;
}

Result<size_t> FurthestStage(const CsvRecord& r, const std::vector<int>& stage_columns,
                             const std::vector<std::string>& stage_names, const std::string& path) {
  auto at = [&](size_t k) {
    return path + ":" + std::to_string(r.line) + ":" + std::to_string(stage_columns[k] + 1);
  };
  int furthest = -1, first_no = -1;
  for (size_t k = 0; k < stage_columns.size(); ++k) {
    const std::string& cell = r.fields[static_cast<size_t>(stage_columns[k])];
    auto flag = StageFlag(cell);
    if (!flag)
      return BadInput(at(k), "the stage '" + stage_names[k] + "' holds '" + Echoed(cell) + "', not yes or no",
                      "write 1, yes, y or true when the application reached the stage, and 0, no, n or false when not");
    if (!*flag) {
      if (first_no < 0) first_no = static_cast<int>(k);
      continue;
    }
    // A later stage passed after an earlier one failed: the earlier cell is
    // where the file contradicts itself first.
    if (first_no >= 0)
      return BadInput(at(static_cast<size_t>(first_no)),
                      "the application reached '" + stage_names[k] + "' but not '" +
                          stage_names[static_cast<size_t>(first_no)] + "' before it",
                      "a stage is reached through every stage before it: correct the '" +
                          stage_names[static_cast<size_t>(first_no)] + "' cell or the '" + stage_names[k] + "' cell");
    furthest = static_cast<int>(k);
  }
  if (furthest < 0)
    return BadInput(at(0), "the application reached no stage, not even '" + stage_names[0] + "'",
                    "every application reached the first stage; write yes there, or leave the row out");
  return static_cast<size_t>(furthest);
}

}  // namespace twinprobe
