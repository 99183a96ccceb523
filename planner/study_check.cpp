#include "planner/study_check.h"

#include "core/ethics_gate.h"
#include "planner/design_file.h"

namespace twinprobe {

Result<CheckedStudy> CheckStudy(const std::string& study_dir) {
  CheckedStudy s;
  auto design = LoadDesign(study_dir);
  if (!design.ok()) return design.error();
  s.design = std::move(design).value();
  if (Status gate = CheckEthicsGate(s.design, DesignPath(study_dir)); !gate.ok()) return gate.error();
  auto vacancies = ReadVacancies(study_dir, s.design);
  if (!vacancies.ok()) return vacancies.error();
  s.vacancies = std::move(vacancies).value();
  auto pools = ReadNamePools(study_dir, s.design);
  if (!pools.ok()) return pools.error();
  s.pools = std::move(pools).value();
  return s;
}

}  // namespace twinprobe
