#include "core/plan_rows.h"

namespace twinprobe {

bool HasCurrentPlan(Store& store) { return store.QueryInt("SELECT count(*) FROM current_plan") > 0; }

CurrentPlanFieldwork ReadCurrentPlanFieldwork(Store& store) {
  CurrentPlanFieldwork f;
  f.sendings = store.QueryInt("SELECT count(*) FROM sending s JOIN current_probe p ON p.id = s.probe_id");
  f.responses = store.QueryInt("SELECT count(*) FROM response r JOIN current_probe p ON p.id = r.probe_id");
  return f;
}

PlanRowWriter::PlanRowWriter(Store& store)
    : store_(store),
      employer_(store.Prepare("INSERT OR IGNORE INTO employer(key, name, contact) VALUES (?1, ?2, ?3)")),
      vacancy_(store.Prepare("INSERT INTO vacancy(plan_id, ref, employer_key, source, opened_on, audit_seq) "
                             "VALUES (?1, ?2, ?3, 'file', ?4, ?5)")),
      stratum_(
          store.Prepare("INSERT INTO vacancy_stratum(vacancy_id, name, value, audit_seq) VALUES (?1, ?2, ?3, ?4)")),
      profile_(store.Prepare("INSERT INTO profile(plan_id, arm_id, display_name, mailbox, phone, fields, audit_seq) "
                             "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)")),
      probe_(store.Prepare("INSERT INTO probe(plan_id, ref, vacancy_id, profile_id, arm_id, template, send_order, "
                           "planned_at, audit_seq) "
                           "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9)")) {}

void PlanRowWriter::InsertEmployer(const std::string& key, const std::string& name, const std::string& contact) {
  employer_.Bind(1, key).Bind(2, name).Bind(3, contact).Run();
}

int64_t PlanRowWriter::InsertVacancy(int64_t seq, const VacancyInsert& v) {
  vacancy_.Bind(1, v.plan_id).Bind(2, v.ref).Bind(3, v.employer_key).Bind(4, v.opened_on).Bind(5, seq).Run();
  return store_.LastInsertId();
}

void PlanRowWriter::InsertVacancyStratum(int64_t seq, int64_t vacancy_id, const std::string& name,
                                         const std::string& value) {
  stratum_.Bind(1, vacancy_id).Bind(2, name).Bind(3, value).Bind(4, seq).Run();
}

int64_t PlanRowWriter::InsertProfile(int64_t seq, const ProfileInsert& p) {
  profile_.Bind(1, p.plan_id).Bind(2, p.arm_id).Bind(3, p.display_name).Bind(4, p.mailbox);
  profile_.Bind(5, p.phone).Bind(6, p.fields_json).Bind(7, seq).Run();
  return store_.LastInsertId();
}

int64_t PlanRowWriter::InsertProbe(int64_t seq, const ProbeInsert& p) {
  probe_.Bind(1, p.plan_id).Bind(2, p.ref).Bind(3, p.vacancy_id).Bind(4, p.profile_id).Bind(5, p.arm_id);
  probe_.Bind(6, p.template_path);
  probe_.Bind(7, p.send_order).Bind(8, p.planned_at).Bind(9, seq).Run();
  return store_.LastInsertId();
}

}  // namespace twinprobe
