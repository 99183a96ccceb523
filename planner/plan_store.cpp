#include "planner/plan_store.h"

#include <nlohmann/json.hpp>

#include "core/audit.h"
#include "core/plan_header.h"
#include "core/plan_rows.h"
#include "core/clock.h"
#include "core/pseudonym.h"
#include "core/sha256.h"
#include "core/stored_codes.h"
#include "planner/materials.h"

namespace twinprobe {

Result<PlanSummary> StorePlan(Store& store, const Design& design, const std::vector<Vacancy>& vacancies,
                              const Plan& plan) {
  AuditedWrite write(store, "plan");
  const CurrentPlanFieldwork field = ReadCurrentPlanFieldwork(store);
  const int64_t sent = field.sendings, answered = field.responses;
  if (sent > 0 || answered > 0)
    return BadInput(store.path(),
                    "the current plan is in the field (" + std::to_string(sent) + " probes sent, " +
                        std::to_string(answered) + " responses recorded) and cannot be replaced",
                    "start a new study folder for a new plan");
  const int64_t seq = write.seq();
  PlanSummary summary;
  std::vector<int64_t> arm_ids;
  summary.plan_id = StorePlanHeader(store, seq, PlanOrigin::kPlanned, design, arm_ids);

  PlanRowWriter rows(store);
  std::vector<int64_t> vacancy_ids;
  for (const auto& v : vacancies) {
    std::string key = EmployerKey(store, v.employer);
    rows.InsertEmployer(key, v.employer, v.contact);
    int64_t vid = rows.InsertVacancy(seq, {summary.plan_id, v.ref, key, v.opened_on});
    vacancy_ids.push_back(vid);
    for (const auto& [name, value] : v.strata) rows.InsertVacancyStratum(seq, vid, name, value);
  }

  std::vector<int64_t> profile_ids;
  for (const auto& p : plan.profiles) {
    // Every template field of the profile, so `render` needs only the store
    // and the vacancies file. std::map keeps the keys sorted: stable bytes.
    nlohmann::json fields_json(nlohmann::json::value_t::object);
    for (const auto& [k, v] : p.fields) fields_json[k] = v;
    if (p.fields.empty()) fields_json = {{"given_name", p.given_name}, {"family_name", p.family_name}};
    std::string fields = fields_json.dump();
    profile_ids.push_back(
        rows.InsertProfile(seq, {summary.plan_id, arm_ids[p.arm], p.full_name(), p.mailbox, p.phone, fields}));
  }

  int serial = 0;
  for (const auto& p : plan.probes) {
    ProbeInsert row;
    row.plan_id = summary.plan_id;
    row.ref = ProbeRef(++serial);
    row.vacancy_id = vacancy_ids[p.vacancy];
    row.profile_id = profile_ids[p.profile];
    row.arm_id = arm_ids[p.arm];
    if (!design.templates.empty()) row.template_path = design.templates[p.template_index];
    row.send_order = p.send_order;
    row.planned_at = FormatIsoTime(p.planned_at);
    rows.InsertProbe(seq, row);
  }
  summary.vacancies = static_cast<int64_t>(vacancies.size());
  summary.probes = static_cast<int64_t>(plan.probes.size());
  summary.profiles = static_cast<int64_t>(plan.profiles.size());
  summary.audit_hash = write.Commit("plan " + std::to_string(summary.plan_id) + ": " +
                                    std::to_string(summary.vacancies) + " vacancies, " +
                                    std::to_string(summary.probes) + " probes");
  return summary;
}

}  // namespace twinprobe
