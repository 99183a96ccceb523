#include "core/stage_counts.h"

#include "core/store.h"

namespace twinprobe {

std::vector<StageCodeCount> ReadCodeCounts(Store& store) {
  std::vector<StageCodeCount> out;
  Stmt s = store.Prepare(
      "SELECT a.label, r.code, count(*) FROM current_probe p JOIN arm a ON a.id = p.arm_id "
      "JOIN current_response r ON r.probe_id = p.id GROUP BY a.label, r.code ORDER BY a.label, r.code");
  while (s.Step()) out.push_back({s.Text(0), s.Text(1), s.Int(2)});
  return out;
}

}  // namespace twinprobe
