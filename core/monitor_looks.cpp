#include "core/monitor_looks.h"

#include "core/audit.h"
#include "core/audit_summaries.h"
#include "core/store.h"

namespace twinprobe {

std::vector<StoredLook> ReadMonitorLooks(Store& store) {
  Stmt q = store.Prepare(
      "SELECT look, kind, sets, planned_sets, information, discordant, reference_only, other_only, lower, alpha, "
      "spending, alpha_allowed, alpha_spent, decision, taken_at, audit_seq FROM monitor_look ORDER BY look, id");
  std::vector<StoredLook> out;
  while (q.Step()) {
    StoredLook l;
    l.look = q.Int(0);
    l.kind = q.Text(1);
    l.sets = q.Int(2);
    l.planned_sets = q.Int(3);
    l.information = q.Double(4);
    l.discordant = q.Int(5);
    l.reference_only = q.Int(6);
    l.other_only = q.Int(7);
    l.lower = q.Int(8);
    l.alpha = q.Double(9);
    l.spending = q.Text(10);
    l.alpha_allowed = q.Double(11);
    l.alpha_spent = q.Double(12);
    l.decision = q.Text(13);
    l.taken_at = q.Text(14);
    l.audit_seq = q.Int(15);
    out.push_back(std::move(l));
  }
  return out;
}

void InsertMonitorLooks(Store& store, const std::vector<StoredLook>& looks, int64_t seq) {
  Stmt ins = store.Prepare(
      "INSERT INTO monitor_look(look, kind, sets, planned_sets, information, discordant, reference_only, other_only, "
      "lower, alpha, spending, alpha_allowed, alpha_spent, decision, taken_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13, ?14, ?15, ?16)");
  for (const StoredLook& l : looks)
    ins.Bind(1, l.look)
        .Bind(2, l.kind)
        .Bind(3, l.sets)
        .Bind(4, l.planned_sets)
        .Bind(5, l.information)
        .Bind(6, l.discordant)
        .Bind(7, l.reference_only)
        .Bind(8, l.other_only)
        .Bind(9, l.lower)
        .Bind(10, l.alpha)
        .Bind(11, l.spending)
        .Bind(12, l.alpha_allowed)
        .Bind(13, l.alpha_spent)
        .Bind(14, l.decision)
        .Bind(15, l.taken_at)
        .Bind(16, seq)
        .Run();
}

StoredLook RecordMonitorLook(Store& store, StoredLook look, std::string* head) {
  AuditedWrite write(store, "monitor");
  look.taken_at = write.at();
  look.audit_seq = write.seq();
  InsertMonitorLooks(store, {look}, write.seq());
  const std::string h =
      write.Commit(MonitorLookSummary(look.look, look.kind, look.sets, look.planned_sets, look.reference_only,
                                      look.other_only, look.lower, look.alpha_spent, look.decision));
  if (head) *head = h;
  return look;
}

}  // namespace twinprobe
