#include "collector/import_sendings.h"

#include <fstream>
#include <unordered_map>

#include "collector/event_time.h"
#include "collector/import_support.h"
#include "collector/responses.h"
#include "core/audit.h"
#include "core/audit_summaries.h"
#include "core/csv.h"
#include "core/progress.h"
#include "core/sending_records.h"
#include "core/suggest.h"

namespace twinprobe {
namespace {

const std::vector<std::string> kKnownColumns = {"probe", "sent_at", "channel", "by"};

}  // namespace

Result<SendingsImportSummary> ImportSendings(Store& store, const std::string& path, const ImportOptions& options,
                                             int early_days, const MaterialCheck& check_material) {
  auto sha = FileSha256(path);
  if (!sha.ok()) return sha.error();
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  CsvReader reader(in, path);
  auto header_result = ReadCsvHeader(reader);
  if (!header_result.ok()) return header_result.error();
  const std::vector<std::string> header = std::move(header_result).value();
  SendingsImportSummary summary;
  auto ignored = CheckImportColumns(path, header, kKnownColumns, {"probe", "sent_at"},
                                    "a sendings file has the columns probe,sent_at and optionally channel,by");
  if (!ignored.ok()) return ignored.error();
  summary.ignored_columns = std::move(ignored).value();
  const int c_probe = FindColumn(header, "probe"), c_at = FindColumn(header, "sent_at"),
            c_channel = FindColumn(header, "channel"), c_by = FindColumn(header, "by");

  AuditedWrite write(store, "import sendings");
  if (AlreadyImported(store, "sendings", sha.value())) {
    summary.already_imported = true;
    return summary;  // nothing written; the transaction rolls back
  }
  RejectWriter rejects(options.reject_path.empty() ? DefaultRejectPath(path) : options.reject_path, header, path,
                       options.raw_cells);
  std::unordered_map<std::string, int64_t> line_of_probe;
  std::unique_ptr<Progress> shown;
  if (options.progress) shown = std::make_unique<Progress>("importing " + path, FileSize(path), Progress::Unit::kBytes);

  CsvRecord row;
  int64_t data_rows = 0;
  while (reader.Next(row)) {
    ++data_rows;
    if (shown) shown->Update(reader.bytes_consumed());
    const std::string where = path + ":" + std::to_string(row.line);
    auto reject = [&](const Error& e) -> Status {
      if (!options.skip_bad) return e;
      return rejects.Add(row.line, e.what, row.fields);
    };
    Status count = CheckFieldCount(row, header.size(), path);
    if (!count.ok()) {
      Status s = reject(count.error());
      if (!s.ok()) return s.error();
      continue;
    }
    SendingEntry e;
    e.probe_ref = row.fields[c_probe];
    e.sent_at = row.fields[c_at];
    if (c_channel >= 0) e.channel = row.fields[c_channel];
    if (c_by >= 0) e.sent_by = row.fields[c_by];
    std::optional<Error> bad;
    if (e.probe_ref.empty()) {
      bad = BadInput(where, "the probe is empty", "give the probe reference, e.g. P00001");
    } else if (auto it = line_of_probe.find(e.probe_ref); it != line_of_probe.end()) {
      bad = BadInput(where, "probe '" + e.probe_ref + "' appears twice (first on line " + std::to_string(it->second) + ")",
                     "keep one row per probe; to correct a sending time, import a later file or use 'sent'");
    } else if (e.sent_at.empty()) {
      // "" would mean "now" to `sent`; in a log it is a gap, not a time.
      bad = BadInput(where, "sent_at is empty", "give the time the application left (YYYY-MM-DD or YYYY-MM-DDTHH:MM)");
    }
    if (!bad) {
      line_of_probe.emplace(e.probe_ref, row.line);
      const int64_t probe_id = FindProbe(store, e.probe_ref);
      auto parsed = ParseEventTime(e.sent_at);
      if (probe_id != 0 && parsed && LastSentAt(store, probe_id) == parsed->text()) {
        ++summary.rows_unchanged;  // recorded before, by `sent` or an earlier log
        continue;
      }
      if (probe_id != 0 && check_material)
        if (Status m = check_material(e.probe_ref); !m.ok()) {
          Error located = m.error();
          located.where = where;
          bad = located;
        }
      if (!bad) {
        auto r = AddSending(store, e, early_days, write.seq(), write.actor(), write.at(), where);
        if (r.ok()) {
          ++summary.rows_landed;
          continue;
        }
        bad = r.error();
      }
    }
    if (!e.probe_ref.empty()) line_of_probe.emplace(e.probe_ref, row.line);
    Status s = reject(*bad);
    if (!s.ok()) return s.error();
  }
  if (reader.error()) return *reader.error();  // a malformed CSV fails even with --skip-bad
  auto end = FinishRowImport(store, write.seq(), "sendings", sha.value(), path, data_rows, summary.rows_landed, "sending",
                             shown.get(), rejects);
  if (!end.ok()) return end.error();
  summary.rows_rejected = end.value().rows_rejected;
  summary.reject_path = end.value().reject_path;
  summary.audit_hash = write.Commit(ImportSendingsSummary(path, summary.rows_landed, summary.rows_rejected));
  return summary;
}

}  // namespace twinprobe
