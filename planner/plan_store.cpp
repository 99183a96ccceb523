#include "planner/plan_store.h"

#include <nlohmann/json.hpp>

#include "core/audit.h"
#include "core/plan_header.h"
#include "core/clock.h"
#include "core/pseudonym.h"
#include "core/sha256.h"
#include "planner/materials.h"

namespace twinprobe {

Result<PlanSummary> StorePlan(Store& store, const Design& design, const std::vector<Vacancy>& vacancies,
                              const Plan& plan) {
  AuditedWrite write(store, "plan");
  int64_t sent = store.QueryInt("SELECT count(*) FROM sending s JOIN current_probe p ON p.id = s.probe_id");
  int64_t answered = store.QueryInt("SELECT count(*) FROM response r JOIN current_probe p ON p.id = r.probe_id");
  if (sent > 0 || answered > 0)
    return BadInput(store.path(),
                    "the current plan is in the field (" + std::to_string(sent) + " probes sent, " +
                        std::to_string(answered) + " responses recorded) and cannot be replaced",
                    "start a new study folder for a new plan");
  const int64_t seq = write.seq();
  PlanSummary summary;
  std::vector<int64_t> arm_ids;
  summary.plan_id = StorePlanHeader(store, seq, "plan", design, arm_ids);

  Stmt ins_emp = store.Prepare("INSERT OR IGNORE INTO employer(key, name, contact) VALUES (?1, ?2, ?3)");
  Stmt ins_vac = store.Prepare(
      "INSERT INTO vacancy(plan_id, ref, employer_key, source, opened_on, audit_seq) VALUES (?1, ?2, ?3, 'file', ?4, ?5)");
  Stmt ins_str = store.Prepare("INSERT INTO vacancy_stratum(vacancy_id, name, value, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  std::vector<int64_t> vacancy_ids;
  for (const auto& v : vacancies) {
    std::string key = EmployerKey(store, v.employer);
    ins_emp.Bind(1, key).Bind(2, v.employer).Bind(3, v.contact).Run();
    ins_vac.Bind(1, summary.plan_id).Bind(2, v.ref).Bind(3, key).Bind(4, v.opened_on).Bind(5, seq).Run();
    int64_t vid = store.LastInsertId();
    vacancy_ids.push_back(vid);
    for (const auto& [name, value] : v.strata) ins_str.Bind(1, vid).Bind(2, name).Bind(3, value).Bind(4, seq).Run();
  }

  Stmt ins_prof = store.Prepare(
      "INSERT INTO profile(plan_id, arm_id, display_name, mailbox, phone, fields, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)");
  std::vector<int64_t> profile_ids;
  for (const auto& p : plan.profiles) {
    // Every template field of the profile, so `render` needs only the store
    // and the vacancies file. std::map keeps the keys sorted: stable bytes.
    nlohmann::json fields_json(nlohmann::json::value_t::object);
    for (const auto& [k, v] : p.fields) fields_json[k] = v;
    if (p.fields.empty()) fields_json = {{"given_name", p.given_name}, {"family_name", p.family_name}};
    std::string fields = fields_json.dump();
    ins_prof.Bind(1, summary.plan_id).Bind(2, arm_ids[p.arm]).Bind(3, p.full_name()).Bind(4, p.mailbox);
    ins_prof.Bind(5, p.phone).Bind(6, fields).Bind(7, seq).Run();
    profile_ids.push_back(store.LastInsertId());
  }

  Stmt ins_probe = store.Prepare(
      "INSERT INTO probe(plan_id, ref, vacancy_id, profile_id, arm_id, template, send_order, planned_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9)");
  int serial = 0;
  for (const auto& p : plan.probes) {
    ins_probe.Bind(1, summary.plan_id).Bind(2, ProbeRef(++serial)).Bind(3, vacancy_ids[p.vacancy]).Bind(4, profile_ids[p.profile]);
    ins_probe.Bind(5, arm_ids[p.arm]);
    if (design.templates.empty()) ins_probe.BindNull(6);
    else ins_probe.Bind(6, design.templates[p.template_index]);
    ins_probe.Bind(7, p.send_order).Bind(8, FormatIsoTime(p.planned_at)).Bind(9, seq).Run();
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
