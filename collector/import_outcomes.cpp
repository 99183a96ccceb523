#include "collector/import_outcomes.h"

#include <fstream>
#include <unordered_map>

#include "collector/import_support.h"
#include "collector/responses.h"
#include "core/audit.h"
#include "core/audit_summaries.h"
#include "core/csv.h"
#include "core/progress.h"
#include "core/suggest.h"

namespace twinprobe {
namespace {

const std::vector<std::string> kKnownColumns = {"probe", "code", "received_at", "channel", "note"};

}  // namespace

Result<ImportSummary> ImportOutcomes(Store& store, const OutcomeScheme& scheme, const std::string& path,
                                     const ImportOptions& options) {
  auto sha = FileSha256(path);
  if (!sha.ok()) return sha.error();
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  CsvReader reader(in, path);
  auto header_result = ReadCsvHeader(reader);
  if (!header_result.ok()) return header_result.error();
  const std::vector<std::string> header = std::move(header_result).value();
  ImportSummary summary;
  auto ignored = CheckImportColumns(path, header, kKnownColumns, {"probe", "code", "received_at"},
                                    "an outcomes file has the columns probe,code,received_at and optionally channel,note");
  if (!ignored.ok()) return ignored.error();
  summary.ignored_columns = std::move(ignored).value();
  const int c_probe = FindColumn(header, "probe"), c_code = FindColumn(header, "code"),
            c_at = FindColumn(header, "received_at"), c_channel = FindColumn(header, "channel"),
            c_note = FindColumn(header, "note");

  AuditedWrite write(store, "import outcomes");
  if (AlreadyImported(store, "outcomes", sha.value())) {
    summary.already_imported = true;
    return summary;  // nothing written; the transaction rolls back
  }
  ResponseWriter writer(store, scheme, write.seq(), write.actor(), write.at());
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
    ResponseEntry e;
    e.probe_ref = row.fields[c_probe];
    e.code = row.fields[c_code];
    e.received_at = row.fields[c_at];
    if (c_channel >= 0) e.channel = row.fields[c_channel];
    if (c_note >= 0) e.note = row.fields[c_note];
    e.origin = "import";
    TimeReading time{"received_at", false};
    std::optional<Error> bad;
    if (e.probe_ref.empty()) {
      bad = BadInput(where, "the probe is empty", "give the probe reference, e.g. P00001");
    } else if (auto it = line_of_probe.find(e.probe_ref); it != line_of_probe.end()) {
      bad = BadInput(where, "probe '" + e.probe_ref + "' appears twice (first on line " + std::to_string(it->second) + ")",
                     "keep one row per probe; to correct a recorded response, import a later file or use 'record'");
    } else if (e.received_at.empty()) {
      if (e.code == "none") time.unknown = true;
      else
        bad = BadInput(where, "received_at is empty",
                       "give the time the response arrived (YYYY-MM-DD or YYYY-MM-DDTHH:MM); only code 'none' may "
                       "leave it empty");
    }
    if (!bad) {
      auto r = writer.Add(e, where, time);
      if (r.ok()) {
        line_of_probe.emplace(e.probe_ref, row.line);
        ++summary.rows_landed;
        if (r.value().late) ++summary.late;
        if (r.value().superseded) ++summary.superseding;
        continue;
      }
      bad = r.error();
    }
    if (!e.probe_ref.empty()) line_of_probe.emplace(e.probe_ref, row.line);
    Status s = reject(*bad);
    if (!s.ok()) return s.error();
  }
  if (reader.error()) return *reader.error();  // a malformed CSV fails even with --skip-bad
  auto end = FinishRowImport(store, write.seq(), "outcomes", sha.value(), path, data_rows, summary.rows_landed, "response",
                             shown.get(), rejects);
  if (!end.ok()) return end.error();
  summary.rows_rejected = end.value().rows_rejected;
  summary.reject_path = end.value().reject_path;
  summary.audit_hash = write.Commit(ImportOutcomesSummary(path, summary.rows_landed, summary.rows_rejected));
  return summary;
}

}  // namespace twinprobe
