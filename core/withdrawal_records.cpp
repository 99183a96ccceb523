#include "core/withdrawal_records.h"

#include "core/store.h"

namespace twinprobe {
namespace {

std::optional<Withdrawal> FirstWithdrawal(Stmt& q) {
  if (!q.Step()) return std::nullopt;
  return Withdrawal{q.Text(0), q.Text(1), q.Text(2)};
}

}  // namespace

void InsertWithdrawal(Store& store, const WithdrawalRow& row) {
  Stmt ins = store.Prepare(
      "INSERT INTO withdrawal(vacancy_id, reason, withdrawn_at, entered_by, entered_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins.Bind(1, row.vacancy_id).Bind(2, row.reason).Bind(3, row.withdrawn_at).Bind(4, row.entered_by);
  ins.Bind(5, row.entered_at).Bind(6, row.audit_seq).Run();
}

int64_t FindVacancy(Store& store, const std::string& vacancy_ref) {
  Stmt q = store.Prepare("SELECT id FROM vacancy WHERE plan_id = (SELECT max(id) FROM plan) AND ref = ?1");
  q.Bind(1, vacancy_ref);
  return q.Step() ? q.Int(0) : 0;
}

std::vector<std::string> VacancyRefs(Store& store) {
  Stmt q = store.Prepare("SELECT ref FROM vacancy WHERE plan_id = (SELECT max(id) FROM plan) ORDER BY id");
  std::vector<std::string> out;
  while (q.Step()) out.push_back(q.Text(0));
  return out;
}

std::optional<Withdrawal> WithdrawalOfVacancy(Store& store, int64_t vacancy_id) {
  Stmt q = store.Prepare(
      "SELECT v.ref, w.reason, w.withdrawn_at FROM withdrawal w JOIN vacancy v ON v.id = w.vacancy_id "
      "WHERE w.vacancy_id = ?1 ORDER BY w.id LIMIT 1");
  q.Bind(1, vacancy_id);
  return FirstWithdrawal(q);
}

std::optional<Withdrawal> WithdrawalOfProbe(Store& store, int64_t probe_id) {
  Stmt q = store.Prepare(
      "SELECT v.ref, w.reason, w.withdrawn_at FROM probe p JOIN withdrawal w ON w.vacancy_id = p.vacancy_id "
      "JOIN vacancy v ON v.id = w.vacancy_id WHERE p.id = ?1 ORDER BY w.id LIMIT 1");
  q.Bind(1, probe_id);
  return FirstWithdrawal(q);
}

VacancyProbeCounts CountVacancyProbes(Store& store, int64_t vacancy_id) {
  Stmt q = store.Prepare(
      "SELECT count(*), "
      "  coalesce(sum(NOT EXISTS (SELECT 1 FROM sending s WHERE s.probe_id = p.id)), 0), "
      "  coalesce(sum((SELECT count(*) FROM response r WHERE r.probe_id = p.id)), 0) "
      "FROM probe p WHERE p.vacancy_id = ?1");
  q.Bind(1, vacancy_id);
  q.Step();
  return {q.Int(0), q.Int(1), q.Int(2)};
}

}  // namespace twinprobe
