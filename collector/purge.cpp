#include "collector/purge.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <map>

#include "core/audit.h"
#include "core/clock.h"
#include "core/csv.h"
#include "core/pseudonym.h"
#include "core/purge_records.h"
#include "core/text.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

constexpr const char* kPurgedEmployer = "(purged)";

std::vector<std::string> ListFiles(const fs::path& study, const char* dir) {
  std::vector<std::string> out;
  std::error_code ec;
  if (!fs::is_directory(study / dir, ec)) return out;
  for (auto it = fs::recursive_directory_iterator(study / dir, ec); it != fs::recursive_directory_iterator();
       it.increment(ec))
    if (it->is_regular_file(ec)) out.push_back(fs::relative(it->path(), study, ec).generic_string());
  std::sort(out.begin(), out.end());
  return out;
}

// A [mail] path resolved against the study folder, and whether it lies
// inside it (lexically, after resolving "..": a symlink is not followed).
std::pair<fs::path, bool> ResolveMailbox(const fs::path& study, const std::string& given) {
  const fs::path root = fs::absolute(study).lexically_normal();
  const fs::path full = (fs::path(given).is_absolute() ? fs::path(given) : root / given).lexically_normal();
  const fs::path rel = full.lexically_relative(root);
  const bool inside = !rel.empty() && *rel.begin() != ".." && rel != ".";
  return {full, inside};
}

// Files of the mailboxes inside the study folder (relative to it), and the
// mailboxes outside it (as given) that exist.
void ListMailboxes(const fs::path& study, const PurgeFileSpec& files, std::vector<std::string>& inside,
                   std::vector<std::string>& outside) {
  std::error_code ec;
  for (const auto& given : files.mailboxes) {
    auto [full, is_inside] = ResolveMailbox(study, given);
    if (!fs::exists(full, ec)) continue;
    if (!is_inside) {
      outside.push_back(given);
      continue;
    }
    const fs::path rel = full.lexically_relative(fs::absolute(study).lexically_normal());
    if (fs::is_regular_file(full, ec))
      inside.push_back(rel.generic_string());
    else
      for (auto& f : ListFiles(study, rel.string().c_str())) inside.push_back(std::move(f));
  }
}

constexpr std::uintmax_t kLargestFileScanned = 64u << 20;

// Files of the study folder, other than those purge handles itself, whose
// text holds one of `identities` (ignoring ASCII case).
std::vector<std::string> FindFilesNamingEmployers(const fs::path& study, const std::vector<std::string>& identities,
                                                  const std::vector<std::string>& handled) {
  std::vector<std::string> out;
  if (identities.empty()) return out;
  std::vector<std::string> needles;
  for (const auto& id : identities)  // as mail matching does: shorter names match too much to mean anything
    if (id.size() >= 4) needles.push_back(Lower(id));
  std::error_code ec;
  for (auto it = fs::recursive_directory_iterator(study, ec); it != fs::recursive_directory_iterator();
       it.increment(ec)) {
    if (!it->is_regular_file(ec) || it->file_size(ec) > kLargestFileScanned) continue;
    const std::string rel = fs::relative(it->path(), study, ec).generic_string();
    // The store is purged in place; a copy of it (study.db.bak) is not, so
    // only the live files are skipped.
    const bool store = rel == "study.db" || rel == "study.db-wal" || rel == "study.db-shm" || rel == "study.db-journal";
    if (store || std::find(handled.begin(), handled.end(), rel) != handled.end()) continue;
    std::ifstream in(it->path(), std::ios::binary);
    const std::string text = Lower(std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()));
    for (const auto& n : needles)
      if (text.find(n) != std::string::npos) {
        out.push_back(rel);
        break;
      }
  }
  std::sort(out.begin(), out.end());
  return out;
}

bool IsKept(const std::string& column, const PurgeFileSpec& files) {
  // The reference and opening date identify no one; strata are what
  // analysis needs. Everything else a user put beside the employer
  // (recruiter, street, phone) may identify, so it goes.
  return column == "vacancy" || column == "opened_on" ||
         std::find(files.keep_columns.begin(), files.keep_columns.end(), column) != files.keep_columns.end();
}

// The vacancies file rewritten: employer names become the pseudonyms the
// plan holds, other free columns are emptied. `keys` maps a vacancy
// reference to its pseudonym; a row the plan does not know gets `fallback`
// applied to its employer name.
struct VacancyRewrite {
  std::vector<VacancyColumnChange> columns;
  std::string text;  // the new file
};

template <typename Fallback>
VacancyRewrite RewriteVacancies(const CsvTable& table, const PurgeFileSpec& files,
                                const std::map<std::string, std::string>& keys, Fallback fallback) {
  VacancyRewrite out;
  const int ref_col = table.Column("vacancy"), employer_col = table.Column("employer");
  std::vector<int64_t> changed(table.header.size(), 0);
  std::vector<std::vector<std::string>> rows;
  for (const CsvRecord& rec : table.rows) {
    std::vector<std::string> row = rec.fields;
    for (size_t c = 0; c < row.size(); ++c) {
      std::string now = row[c];
      if (static_cast<int>(c) == employer_col) {
        auto key = ref_col >= 0 ? keys.find(row[ref_col]) : keys.end();
        now = key != keys.end() && !key->second.empty() ? key->second : fallback(row[c]);
      } else if (!IsKept(table.header[c], files)) {
        now.clear();
      }
      if (now != row[c]) ++changed[c];
      row[c] = now;
    }
    rows.push_back(std::move(row));
  }
  for (size_t c = 0; c < table.header.size(); ++c)
    if (changed[c] > 0)
      out.columns.push_back(
          {table.header[c], static_cast<int>(c) == employer_col ? "pseudonymised" : "emptied", changed[c]});
  auto line = [](const std::vector<std::string>& fields) {
    std::string s;
    for (size_t i = 0; i < fields.size(); ++i) s += (i ? "," : "") + CsvQuote(fields[i]);
    return s + "\n";
  };
  out.text = line(table.header);
  for (const auto& row : rows) out.text += line(row);
  return out;
}

// Reads the vacancies file named by `files`; nullopt table when the study
// has none (or it is gone).
Result<std::optional<CsvTable>> ReadVacancyFile(const std::string& study_dir, const PurgeFileSpec& files) {
  if (files.vacancies_file.empty()) return std::optional<CsvTable>();
  const fs::path path = fs::path(study_dir) / files.vacancies_file;
  std::error_code ec;
  if (!fs::is_regular_file(path, ec)) return std::optional<CsvTable>();
  auto table = ReadCsvFile(path.string());
  if (!table.ok()) return table.error();
  return std::optional<CsvTable>(std::move(table).value());
}

}  // namespace

Result<PurgeCounts> PlanPurge(Store& store, const std::string& study_dir, int retention_days, int window_days,
                              const PurgeFileSpec& files) {
  PurgeCounts c;
  const PurgeableRows rows = CountPurgeableRows(store);
  c.employers = rows.employers;
  c.secrets = rows.secrets;
  c.notes = rows.notes;
  c.mail_excerpts = rows.mail_excerpts;
  for (const char* dir : {"materials", "snapshots"})
    for (auto& f : ListFiles(study_dir, dir)) c.deleted_files.push_back(std::move(f));
  ListMailboxes(study_dir, files, c.deleted_files, c.outside_mailboxes);
  std::sort(c.deleted_files.begin(), c.deleted_files.end());
  c.deleted_files.erase(std::unique(c.deleted_files.begin(), c.deleted_files.end()), c.deleted_files.end());
  c.material_files = static_cast<int64_t>(ListFiles(study_dir, "materials").size());
  c.snapshot_files = static_cast<int64_t>(ListFiles(study_dir, "snapshots").size());
  c.mailbox_files = static_cast<int64_t>(c.deleted_files.size()) - c.material_files - c.snapshot_files;
  auto table = ReadVacancyFile(study_dir, files);
  if (!table.ok()) return table.error();
  if (table.value()) {
    c.vacancies_file = files.vacancies_file;
    // A dry run must not create the secret, so a row the plan does not know
    // is counted as changed without computing its pseudonym.
    c.vacancy_columns =
        RewriteVacancies(*table.value(), files, ReadVacancyEmployerKeys(store), [](const std::string& name) {
          return name.rfind("E-", 0) == 0 ? name : std::string(kPurgedEmployer);
        }).columns;
  }
  std::vector<std::string> handled = c.deleted_files;
  if (table.value()) handled.push_back(fs::path(files.vacancies_file).lexically_normal().generic_string());
  c.files_naming_employers = FindFilesNamingEmployers(study_dir, ReadEmployerIdentities(store), handled);
  const auto end = ReadFieldworkEnd(store, window_days);
  const int64_t end_t = end ? end->at : 0;
  if (end) c.fieldwork_end = FormatIsoTime(end->at), c.fieldwork_end_what = end->what;
  c.retention_ends = FormatIsoTime(end_t + static_cast<int64_t>(retention_days) * 86400);
  c.already_purged = WasPurged(store);
  return c;
}

Result<PurgeCounts> Purge(Store& store, const std::string& study_dir, int retention_days, int window_days,
                          int64_t now, const PurgeFileSpec& files) {
  auto planned = PlanPurge(store, study_dir, retention_days, window_days, files);
  if (!planned.ok()) return planned.error();
  PurgeCounts c = planned.value();
  bool anything = c.employers + c.secrets + c.notes + c.mail_excerpts > 0 || !c.deleted_files.empty() ||
                  !c.vacancy_columns.empty();
  if (anything && now < ParseIsoTime(c.retention_ends).value_or(0))
    return BadInput("", "the retention period has not ended: the fieldwork " +
                            std::string(now >= ParseIsoTime(c.fieldwork_end).value_or(0) ? "ended " : "ends ") +
                            c.fieldwork_end + " (" + c.fieldwork_end_what + ") and " +
                            std::to_string(retention_days) + " days of retention run until " + c.retention_ends,
                    "wait until then (see 'twinprobe purge --dry-run'), or change [ethics].retention_days only "
                    "with your board's consent");
  auto table = ReadVacancyFile(study_dir, files);
  if (!table.ok()) return table.error();
  const fs::path vacancies = fs::path(study_dir) / files.vacancies_file;
  const fs::path rewritten = vacancies.string() + ".purge-tmp";
  bool rewrite = false;
  {
    // secure_delete overwrites freed pages, so deleted names do not linger in the file.
    EnableSecureDelete(store);
    AuditedWrite write(store, "purge");
    if (table.value() && !c.vacancy_columns.empty()) {
      // Pseudonyms of rows the plan does not know need the secret, which
      // the erasure below deletes: compute them first, in this transaction.
      const bool has_secret = c.secrets > 0;
      VacancyRewrite r = RewriteVacancies(*table.value(), files, ReadVacancyEmployerKeys(store),
                                          [&](const std::string& name) {
                                            if (name.rfind("E-", 0) == 0) return name;
                                            return has_secret ? EmployerKey(store, name) : std::string(kPurgedEmployer);
                                          });
      std::ofstream out(rewritten, std::ios::binary | std::ios::trunc);
      out << r.text;
      out.close();
      if (!out)
        return BadInput(rewritten.string(), "cannot write the pseudonymised vacancies file",
                        "check that the study folder is writable; nothing was purged");
      rewrite = true;
    }
    EraseIdentities(store, write.seq(), write.at());
    std::string columns;
    for (const auto& col : c.vacancy_columns)
      columns += (columns.empty() ? "" : ", ") + col.column + " " + col.action + " (" + std::to_string(col.cells) + ")";
    write.Commit("purge: " + std::to_string(c.employers) + " employer identities, " + std::to_string(c.notes) +
                 " notes, " + std::to_string(c.mail_excerpts) + " mail excerpts, " + std::to_string(c.snapshot_files) +
                 " snapshots, " + std::to_string(c.material_files) + " material files, " +
                 std::to_string(c.mailbox_files) + " mailbox files" +
                 (columns.empty() ? "" : "; " + c.vacancies_file + ": " + columns));
  }
  // Old page images may survive in the write-ahead log until a checkpoint.
  CheckpointLog(store);
  std::error_code ec;
  if (rewrite) fs::rename(rewritten, vacancies, ec);
  for (const char* dir : {"snapshots", "materials"}) fs::remove_all(fs::path(study_dir) / dir, ec);
  for (const auto& given : files.mailboxes)
    if (auto [full, inside] = ResolveMailbox(study_dir, given); inside) fs::remove_all(full, ec);
  return c;
}

}  // namespace twinprobe
