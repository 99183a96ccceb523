#include "collector/purge.h"

#include <filesystem>

#include "core/audit.h"
#include "core/clock.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

int64_t CountFiles(const fs::path& dir) {
  int64_t n = 0;
  std::error_code ec;
  if (!fs::is_directory(dir, ec)) return 0;
  for (auto it = fs::recursive_directory_iterator(dir, ec); it != fs::recursive_directory_iterator(); it.increment(ec))
    if (it->is_regular_file(ec)) ++n;
  return n;
}

}  // namespace

PurgeCounts PlanPurge(Store& store, const std::string& study_dir, int retention_days) {
  PurgeCounts c;
  c.employers = store.QueryInt("SELECT count(*) FROM employer WHERE name IS NOT NULL OR contact IS NOT NULL");
  c.secrets = store.QueryInt("SELECT count(*) FROM secret");
  c.notes = store.QueryInt("SELECT count(*) FROM response WHERE note IS NOT NULL");
  c.mail_excerpts = store.QueryInt("SELECT count(*) FROM mail_message WHERE excerpt IS NOT NULL");
  c.snapshot_files = CountFiles(fs::path(study_dir) / "snapshots");
  c.material_files = CountFiles(fs::path(study_dir) / "materials");
  Stmt end = store.Prepare(
      "SELECT max(t) FROM (SELECT max(sent_at) AS t FROM sending UNION ALL SELECT max(received_at) FROM response "
      "UNION ALL SELECT max(fetched_at) FROM listing)");
  if (end.Step() && !end.IsNull(0)) c.fieldwork_end = end.Text(0);
  int64_t end_t = ParseIsoTime(c.fieldwork_end).value_or(0);
  c.retention_ends = FormatIsoTime(end_t + static_cast<int64_t>(retention_days) * 86400);
  c.already_purged = store.QueryInt("SELECT count(*) FROM meta WHERE key = 'purged_at'") > 0;
  return c;
}

Result<PurgeCounts> Purge(Store& store, const std::string& study_dir, int retention_days, int64_t now) {
  PurgeCounts c = PlanPurge(store, study_dir, retention_days);
  bool anything = c.employers + c.secrets + c.notes + c.mail_excerpts + c.snapshot_files + c.material_files > 0;
  if (anything && now < ParseIsoTime(c.retention_ends).value_or(0))
    return BadInput("", "the retention period has not ended: fieldwork ended " + c.fieldwork_end + " and " +
                            std::to_string(retention_days) + " days of retention run until " + c.retention_ends,
                    "wait until then (see 'twinprobe purge --dry-run'), or change [ethics].retention_days only "
                    "with your board's consent");
  {
    // secure_delete overwrites freed pages, so deleted names do not linger in the file.
    store.Exec("PRAGMA secure_delete = ON");
    AuditedWrite write(store, "purge");
    store.Exec("DELETE FROM employer");
    store.Exec("DELETE FROM secret");
    store.Exec("UPDATE response SET note = NULL WHERE note IS NOT NULL");
    store.Exec("UPDATE mail_message SET excerpt = NULL WHERE excerpt IS NOT NULL");
    store.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES ('purged_at', ?1, ?2)")
        .Bind(1, write.at())
        .Bind(2, write.seq())
        .Run();
    write.Commit("purge: " + std::to_string(c.employers) + " employer identities, " + std::to_string(c.notes) +
                 " notes, " + std::to_string(c.mail_excerpts) + " mail excerpts, " + std::to_string(c.snapshot_files) +
                 " snapshots, " + std::to_string(c.material_files) + " material files");
  }
  // Old page images may survive in the write-ahead log until a checkpoint.
  store.Exec("PRAGMA wal_checkpoint(TRUNCATE)");
  std::error_code ec;
  for (const char* dir : {"snapshots", "materials"}) fs::remove_all(fs::path(study_dir) / dir, ec);
  return c;
}

}  // namespace twinprobe
