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
  if (s.design.kind == "listing") return s;  // a listing audit has no vacancies or name pools to read
  auto vacancies = ReadVacancies(study_dir, s.design);
  if (!vacancies.ok()) return vacancies.error();
  s.vacancies = std::move(vacancies).value();
  SpellingTally tally;
  for (const Vacancy& v : s.vacancies) {
    for (const std::string& stratum : s.design.strata) tally.Add(stratum, v.strata.at(stratum));
    tally.Add("employer", v.employer);
  }
  s.near_duplicates = tally.NearDuplicates();
  auto pools = ReadNamePools(study_dir, s.design);
  if (!pools.ok()) return pools.error();
  s.pools = std::move(pools).value();
  return s;
}

Result<StudyProof> ProveStudy(const std::string& study_dir, const CheckedStudy& s) {
  StudyProof proof;
  if (s.design.kind == "listing")
    return BadInput(DesignPath(study_dir), "a listing audit (kind = \"listing\") sends no probes, so there is nothing to plan",
                    "collect its listings with 'twinprobe fetch'");
  auto plan = AssignProbes(s.design, s.vacancies, s.pools);
  if (!plan.ok()) return plan.error();
  proof.plan = std::move(plan).value();
  auto templates = LoadTemplates(study_dir, s.design);
  if (!templates.ok()) return templates.error();
  proof.templates = std::move(templates).value();
  auto materials = PlannedMaterials(s.design, s.vacancies, s.pools, proof.plan);
  if (!materials.ok()) return materials.error();
  proof.materials = std::move(materials).value();
  auto report = ProveOneDifference(s.design, proof.templates, proof.materials);
  if (!report.ok()) return report.error();
  proof.report = std::move(report).value();
  return proof;
}

}  // namespace twinprobe
