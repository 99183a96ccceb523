#include "core/desk_counts.h"

namespace twinprobe {

DeskCounts ReadDeskCounts(Store& store, const OutcomeScheme& scheme) {
  DeskCounts f;
  f.planned = store.QueryInt("SELECT count(*) FROM current_probe");
  f.sent = store.QueryInt(
      "SELECT count(*) FROM current_probe p WHERE EXISTS (SELECT 1 FROM sending s WHERE s.probe_id = p.id)");
  f.declined = store.QueryInt(
      "SELECT count(*) FROM current_probe p WHERE EXISTS (SELECT 1 FROM decline d WHERE d.probe_id = p.id)");
  f.entries = store.QueryInt("SELECT count(*) FROM audit");
  // The scheme's positive codes live in the design, not the store, so the
  // current codes are read and classified here with is_positive().
  // A probe's newest current response counts, as in `monitor`.
  Stmt q = store.Prepare(
      "SELECT (SELECT r.code FROM current_response r WHERE r.probe_id = p.id ORDER BY r.id DESC LIMIT 1) AS code "
      "FROM current_probe p WHERE code IS NOT NULL");
  while (q.Step()) {
    ++f.responded;
    f.positive += scheme.is_positive(q.Text(0)) ? 1 : 0;
  }
  return f;
}

}  // namespace twinprobe
