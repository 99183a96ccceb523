#include "core/export_records.h"

#include "core/store.h"

namespace twinprobe {
namespace {

std::optional<int64_t> OptInt(const Stmt& s, int col) {
  if (s.IsNull(col)) return std::nullopt;
  return s.Int(col);
}

}  // namespace

std::optional<ExportPlanRow> ReadExportPlan(Store& store) {
  Stmt p = store.Prepare("SELECT id, kind, origin FROM current_plan");
  if (!p.Step()) return std::nullopt;
  return ExportPlanRow{p.Int(0), p.Text(1), p.Text(2)};
}

std::vector<ExportArmRow> ReadExportArms(Store& store, int64_t plan_id) {
  std::vector<ExportArmRow> out;
  Stmt a = store.Prepare("SELECT label, is_reference FROM arm WHERE plan_id = ?1 ORDER BY is_reference DESC, id");
  a.Bind(1, plan_id);
  while (a.Step()) out.push_back({a.Text(0), a.Int(1) != 0});
  return out;
}

std::vector<std::string> ReadVacancyStratumNames(Store& store, int64_t plan_id) {
  std::vector<std::string> out;
  Stmt s = store.Prepare(
      "SELECT DISTINCT vs.name FROM vacancy_stratum vs JOIN vacancy v ON v.id = vs.vacancy_id WHERE v.plan_id = ?1 "
      "ORDER BY vs.name");
  s.Bind(1, plan_id);
  while (s.Step()) out.push_back(s.Text(0));
  return out;
}

void ForEachVacancyStratum(Store& store, int64_t plan_id,
                           const std::function<void(int64_t, const std::string&, const std::string&)>& fn) {
  Stmt s = store.Prepare(
      "SELECT vs.vacancy_id, vs.name, vs.value FROM vacancy_stratum vs JOIN vacancy v ON v.id = vs.vacancy_id "
      "WHERE v.plan_id = ?1");
  s.Bind(1, plan_id);
  while (s.Step()) fn(s.Int(0), s.Text(1), s.Text(2));
}

void ForEachExportVacancy(Store& store, int64_t plan_id, const std::function<void(const ExportVacancyRow&)>& fn) {
  Stmt q = store.Prepare(
      "SELECT v.id, v.ref, v.employer_key, e.name, e.contact, v.source, v.opened_on, v.closed_on FROM vacancy v "
      "LEFT JOIN employer e ON e.key = v.employer_key WHERE v.plan_id = ?1 ORDER BY v.id");
  q.Bind(1, plan_id);
  ExportVacancyRow r;
  while (q.Step()) {
    r.id = q.Int(0);
    r.ref = q.Text(1);
    r.employer_key = q.OptText(2);
    r.employer_name = q.OptText(3);
    r.employer_contact = q.OptText(4);
    r.source = q.OptText(5);
    r.opened_on = q.OptText(6);
    r.closed_on = q.OptText(7);
    fn(r);
  }
}

void ForEachExportProbe(Store& store, int64_t plan_id, const std::function<void(const ExportProbeRow&)>& fn) {
  // One pass: the newest sending and the current response of each probe
  // come from correlated lookups on indexed columns.
  Stmt q = store.Prepare(
      "SELECT p.id, p.ref, v.ref, a.label, a.is_reference, pr.display_name, pr.mailbox, pr.phone, p.template, "
      "  p.send_order, p.planned_at, "
      "  (SELECT s.sent_at FROM sending s WHERE s.probe_id = p.id ORDER BY s.id DESC LIMIT 1), "
      "  r.code, r.received_at, r.channel, r.flags, "
      "  (SELECT count(*) FROM response c WHERE c.probe_id = p.id), p.vacancy_id, "
      "  (SELECT s.sent_at FROM sending s WHERE s.probe_id = p.id ORDER BY s.sent_at LIMIT 1), "
      "  EXISTS (SELECT 1 FROM withdrawal w WHERE w.vacancy_id = p.vacancy_id) "
      "FROM probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "LEFT JOIN profile pr ON pr.id = p.profile_id "
      "LEFT JOIN response r ON r.id = (SELECT cr.id FROM current_response cr WHERE cr.probe_id = p.id "
      "                                ORDER BY cr.id DESC LIMIT 1) "
      "WHERE p.plan_id = ?1 ORDER BY p.id");
  q.Bind(1, plan_id);
  ExportProbeRow r;
  while (q.Step()) {
    r.id = q.Int(0);
    r.ref = q.Text(1);
    r.vacancy_ref = q.Text(2);
    r.arm = q.Text(3);
    r.is_reference = q.Int(4) != 0;
    r.profile = q.OptText(5);
    r.mailbox = q.OptText(6);
    r.phone = q.OptText(7);
    r.template_name = q.OptText(8);
    r.send_order = q.Int(9);
    r.planned_at = q.OptText(10);
    r.sent_at = q.OptText(11);
    r.code = q.OptText(12);
    r.received_at = q.OptText(13);
    r.channel = q.OptText(14);
    r.flags = q.OptText(15);
    r.responses = q.Int(16);
    r.vacancy_id = q.Int(17);
    r.first_sent_at = q.OptText(18);
    r.withdrawn = q.Int(19) != 0;
    fn(r);
  }
}

void ForEachExportResponse(Store& store, int64_t plan_id, const std::function<void(const ExportResponseRow&)>& fn) {
  Stmt q = store.Prepare(
      "SELECT r.id, p.ref, r.code, r.received_at, r.channel, r.origin, r.flags, r.entered_by, r.entered_at, "
      "  r.supersedes, (SELECT min(n.id) FROM response n WHERE n.supersedes = r.id), r.note, "
      "  r.id = (SELECT cr.id FROM current_response cr WHERE cr.probe_id = r.probe_id ORDER BY cr.id DESC LIMIT 1) "
      "FROM response r JOIN probe p ON p.id = r.probe_id WHERE p.plan_id = ?1 ORDER BY r.id");
  q.Bind(1, plan_id);
  ExportResponseRow r;
  while (q.Step()) {
    r.id = q.Int(0);
    r.probe_ref = q.Text(1);
    r.code = q.Text(2);
    r.received_at = q.OptText(3);
    r.channel = q.OptText(4);
    r.origin = q.OptText(5);
    r.flags = q.Text(6);
    r.entered_by = q.Text(7);
    r.entered_at = q.Text(8);
    r.supersedes = OptInt(q, 9);
    r.superseded_by = OptInt(q, 10);
    r.note = q.OptText(11);
    r.current = q.Int(12) != 0;
    fn(r);
  }
}

void ForEachExportSending(Store& store, int64_t plan_id, const std::function<void(const ExportSendingRow&)>& fn) {
  Stmt q = store.Prepare(
      "SELECT s.id, p.ref, s.sent_at, d.channel, d.sent_by, s.entered_by, s.entered_at, "
      "  s.id = (SELECT max(n.id) FROM sending n WHERE n.probe_id = s.probe_id) "
      "FROM sending s JOIN probe p ON p.id = s.probe_id LEFT JOIN sending_detail d ON d.sending_id = s.id "
      "WHERE p.plan_id = ?1 ORDER BY s.id");
  q.Bind(1, plan_id);
  ExportSendingRow r;
  while (q.Step()) {
    r.id = q.Int(0);
    r.probe_ref = q.Text(1);
    r.sent_at = q.Text(2);
    r.channel = q.OptText(3);
    r.sent_by = q.OptText(4);
    r.entered_by = q.Text(5);
    r.entered_at = q.Text(6);
    r.current = q.Int(7) != 0;
    fn(r);
  }
}

void ForEachExportDecline(Store& store, int64_t plan_id, const std::function<void(const ExportDeclineRow&)>& fn) {
  // The response a decline answers is the one current when it was entered:
  // the probe's newest response of an earlier audit entry.
  Stmt q = store.Prepare(
      "WITH declined AS ("
      "  SELECT d.*, (SELECT r.id FROM response r WHERE r.probe_id = d.probe_id AND r.audit_seq < d.audit_seq "
      "               ORDER BY r.id DESC LIMIT 1) AS response_id FROM decline d) "
      "SELECT d.id, p.ref, v.ref, d.response_id, r.code, r.received_at, d.declined_at, d.channel, d.entered_by, "
      "  d.entered_at "
      "FROM declined d JOIN probe p ON p.id = d.probe_id JOIN vacancy v ON v.id = p.vacancy_id "
      "LEFT JOIN response r ON r.id = d.response_id WHERE p.plan_id = ?1 ORDER BY d.id");
  q.Bind(1, plan_id);
  ExportDeclineRow r;
  while (q.Step()) {
    r.id = q.Int(0);
    r.probe_ref = q.Text(1);
    r.vacancy_ref = q.Text(2);
    r.response_id = OptInt(q, 3);
    r.code = q.OptText(4);
    r.received_at = q.OptText(5);
    r.declined_at = q.Text(6);
    r.channel = q.OptText(7);
    r.entered_by = q.Text(8);
    r.entered_at = q.Text(9);
    fn(r);
  }
}

}  // namespace twinprobe
