#include "planner/plan_store.h"

#include "core/audit.h"
#include "core/clock.h"
#include "core/pseudonym.h"
#include "core/sha256.h"

namespace twinprobe {
namespace {

std::string JsonEscape(const std::string& s) {
  std::string out;
  for (unsigned char c : s) {
    if (c == '"' || c == '\\') out += '\\', out += static_cast<char>(c);
    else if (c < 0x20) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\u%04x", c);
      out += buf;
    } else out += static_cast<char>(c);
  }
  return out;
}

}  // namespace

int64_t StorePlanHeader(Store& store, int64_t seq, const std::string& origin, const Design& design,
                        std::vector<int64_t>& arm_ids) {
  Stmt ins_plan = store.Prepare(
      "INSERT INTO plan(origin, kind, design_sha256, seed, created_at, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins_plan.Bind(1, origin).Bind(2, design.kind);
  if (design.canonical.empty()) ins_plan.BindNull(3);
  else ins_plan.Bind(3, Sha256Hex(design.canonical));
  ins_plan.Bind(4, static_cast<int64_t>(design.seed)).Bind(5, NowIso()).Bind(6, seq).Run();
  int64_t plan_id = store.LastInsertId();

  // The store must be readable without the design file (analysis of an
  // imported study, or after the design is lost), so it keeps what analysis
  // needs to know in meta.
  auto join = [](const std::vector<std::string>& v) {
    std::string s;
    for (const auto& x : v) s += (s.empty() ? "" : ",") + x;
    return s;
  };
  Stmt ins_meta = store.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES (?1, ?2, ?3)");
  for (const auto& [k, v] : std::vector<std::pair<std::string, std::string>>{
           {"study_id", design.study_id},
           {"title", design.title},
           {"outcomes.codes", join(design.outcomes.codes)},
           {"outcomes.positive", join(design.outcomes.positive)},
           {"outcomes.window_days", std::to_string(design.outcomes.window_days)},
           {"strata", join(design.strata)}})
    ins_meta.Bind(1, k).Bind(2, v).Bind(3, seq).Run();

  std::map<std::pair<std::string, std::string>, int64_t> level_ids;
  Stmt ins_factor = store.Prepare("INSERT INTO factor(plan_id, name, audit_seq) VALUES (?1, ?2, ?3)");
  Stmt ins_level = store.Prepare(
      "INSERT INTO level(factor_id, name, is_reference, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  for (const auto& f : design.factors) {
    ins_factor.Bind(1, plan_id).Bind(2, f.name).Bind(3, seq).Run();
    int64_t fid = store.LastInsertId();
    for (const auto& l : f.levels) {
      ins_level.Bind(1, fid).Bind(2, l).Bind(3, l == f.reference ? 1 : 0).Bind(4, seq).Run();
      level_ids[{f.name, l}] = store.LastInsertId();
    }
  }
  Stmt ins_arm = store.Prepare("INSERT INTO arm(plan_id, label, is_reference, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  Stmt ins_al = store.Prepare("INSERT INTO arm_level(arm_id, level_id, audit_seq) VALUES (?1, ?2, ?3)");
  arm_ids.clear();
  for (const auto& a : design.arms) {
    ins_arm.Bind(1, plan_id).Bind(2, a.label).Bind(3, a.is_reference ? 1 : 0).Bind(4, seq).Run();
    int64_t aid = store.LastInsertId();
    arm_ids.push_back(aid);
    for (const auto& [f, l] : a.levels) ins_al.Bind(1, aid).Bind(2, level_ids.at({f, l})).Bind(3, seq).Run();
  }
  return plan_id;
}

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
    std::string fields = "{\"given_name\":\"" + JsonEscape(p.given_name) + "\",\"family_name\":\"" +
                         JsonEscape(p.family_name) + "\"}";
    ins_prof.Bind(1, summary.plan_id).Bind(2, arm_ids[p.arm]).Bind(3, p.full_name()).Bind(4, p.mailbox);
    ins_prof.Bind(5, p.phone).Bind(6, fields).Bind(7, seq).Run();
    profile_ids.push_back(store.LastInsertId());
  }

  Stmt ins_probe = store.Prepare(
      "INSERT INTO probe(plan_id, ref, vacancy_id, profile_id, arm_id, template, send_order, planned_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9)");
  int serial = 0;
  for (const auto& p : plan.probes) {
    char ref[16];
    std::snprintf(ref, sizeof ref, "P%05d", ++serial);
    ins_probe.Bind(1, summary.plan_id).Bind(2, ref).Bind(3, vacancy_ids[p.vacancy]).Bind(4, profile_ids[p.profile]);
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
