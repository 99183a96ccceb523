#include "collector/purge.h"

#include <filesystem>

#include "core/audit.h"
#include "core/clock.h"
#include "core/purge_records.h"

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
  const PurgeableRows rows = CountPurgeableRows(store);
  c.employers = rows.employers;
  c.secrets = rows.secrets;
  c.notes = rows.notes;
  c.mail_excerpts = rows.mail_excerpts;
  c.snapshot_files = CountFiles(fs::path(study_dir) / "snapshots");
  c.material_files = CountFiles(fs::path(study_dir) / "materials");
  c.fieldwork_end = ReadFieldworkEnd(store).value_or("");
  int64_t end_t = ParseIsoTime(c.fieldwork_end).value_or(0);
  c.retention_ends = FormatIsoTime(end_t + static_cast<int64_t>(retention_days) * 86400);
  c.already_purged = WasPurged(store);
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
    EnableSecureDelete(store);
    AuditedWrite write(store, "purge");
    EraseIdentities(store, write.seq(), write.at());
    write.Commit("purge: " + std::to_string(c.employers) + " employer identities, " + std::to_string(c.notes) +
                 " notes, " + std::to_string(c.mail_excerpts) + " mail excerpts, " + std::to_string(c.snapshot_files) +
                 " snapshots, " + std::to_string(c.material_files) + " material files");
  }
  // Old page images may survive in the write-ahead log until a checkpoint.
  CheckpointLog(store);
  std::error_code ec;
  for (const char* dir : {"snapshots", "materials"}) fs::remove_all(fs::path(study_dir) / dir, ec);
  return c;
}

}  // namespace twinprobe
