#include "core/sending_records.h"

#include "core/store.h"

namespace twinprobe {

std::string LastSentAt(Store& store, int64_t probe_id) {
  Stmt s = store.Prepare("SELECT sent_at FROM sending WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1");
  s.Bind(1, probe_id);
  return s.Step() ? s.Text(0) : std::string();
}

std::optional<std::string> CurrentResponseReceivedAt(Store& store, int64_t probe_id) {
  Stmt s = store.Prepare(
      "SELECT received_at FROM current_response WHERE probe_id = ?1 AND received_at IS NOT NULL ORDER BY id DESC "
      "LIMIT 1");
  s.Bind(1, probe_id);
  if (!s.Step()) return std::nullopt;
  return s.Text(0);
}

void InsertSending(Store& store, const SendingRow& row) {
  Stmt ins = store.Prepare(
      "INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)");
  ins.Bind(1, row.probe_id).Bind(2, row.sent_at).Bind(3, row.entered_by).Bind(4, row.entered_at).Bind(5, row.audit_seq)
      .Run();
  if (row.channel.empty() && row.sent_by.empty()) return;
  const int64_t sending_id = store.LastInsertId();
  Stmt detail = store.Prepare(
      "INSERT INTO sending_detail(sending_id, channel, sent_by, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  detail.Bind(1, sending_id);
  if (!row.channel.empty()) detail.Bind(2, row.channel);
  if (!row.sent_by.empty()) detail.Bind(3, row.sent_by);
  detail.Bind(4, row.audit_seq).Run();
}

std::optional<std::string> FirstPlannedSending(Store& store) {
  Stmt s = store.Prepare("SELECT min(planned_at) FROM current_probe WHERE planned_at IS NOT NULL AND planned_at != ''");
  if (!s.Step() || s.IsNull(0)) return std::nullopt;
  return s.Text(0);
}

}  // namespace twinprobe
