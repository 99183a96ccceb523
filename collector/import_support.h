#pragma once
// What every CSV import shares: the file's content digest (a second import
// of the same bytes adds nothing; the record of imported files is in
// core/import_files.h) and the reject file that --skip-bad writes.
#include <cstdint>
#include <fstream>
#include <memory>
#include <string>
#include <vector>

#include "core/import_files.h"  // IWYU pragma: export
#include "core/safe_write.h"
#include "core/status.h"

namespace twinprobe {

// SHA-256 of the file's bytes, hex; a bad-input error when it cannot be read.
Result<std::string> FileSha256(const std::string& path);
// Size in bytes (0 when unknown), for progress bars.
int64_t FileSize(const std::string& path);

// Columns a reject file adds in front of the original ones. Importers skip
// columns named reject_* so a corrected reject file imports as it is.
bool IsRejectColumn(const std::string& column);

// The header of a file of one row per probe checked against the columns an
// importer knows: a missing `required` column is refused at FILE:1, with the
// nearest unknown column as a suggestion and `columns_fix` as the fix (e.g.
// "an outcomes file has the columns probe,code,received_at and optionally
// channel,note"); otherwise the columns it will ignore (unknown ones, not
// reject_*), in header order.
Result<std::vector<std::string>> CheckImportColumns(const std::string& path, const std::vector<std::string>& header,
                                                    const std::vector<std::string>& known,
                                                    const std::vector<std::string>& required,
                                                    const std::string& columns_fix);

// Writes rejected rows: reject_line, reject_reason, then the original
// columns, as RFC 4180 CSV with CRLF line ends. Opens the file at the first
// row, so nothing is written when no row is rejected. The file is written
// beside its target and renamed into place by Close (core/safe_write.h: a
// planted link is replaced, never followed); cells that a spreadsheet would
// run as a formula get a leading "'" unless `raw_cells`
// (core/spreadsheet_cell.h).
class RejectWriter {
 public:
  // `input` is the file being imported: the reject file may never replace it.
  RejectWriter(std::string path, std::vector<std::string> header, std::string input, bool raw_cells);
  // A bad-input error when the file cannot be written or is the input.
  Status Add(int64_t line, const std::string& reason, const std::vector<std::string>& fields);
  Status Close();
  int64_t rows() const { return rows_; }
  const std::string& path() const { return path_; }

 private:
  std::string path_;
  std::vector<std::string> header_;
  std::string input_;
  bool raw_cells_ = false;
  std::unique_ptr<SafeFile> out_;
  int64_t rows_ = 0;
};

// The default reject file for `path`: "FILE.rejects.csv".
std::string DefaultRejectPath(const std::string& path);

class Progress;
class Store;

struct RowImportEnd {
  int64_t rows_rejected = 0;
  std::string reject_path;  // "" when no row was rejected
};

// The end every import of one row per probe shares (outcomes, sendings),
// after its last row: a file without data rows is refused ("add one row per
// `row_noun` under the header"), the progress bar (if any) is finished, the
// reject file closed, and the file recorded under `kind` with its digest and
// counts in the audit entry `seq` (core/import_files.h), so the same bytes
// twice add nothing.
Result<RowImportEnd> FinishRowImport(Store& store, int64_t seq, const std::string& kind, const std::string& sha,
                                     const std::string& path, int64_t data_rows, int64_t rows_landed,
                                     const std::string& row_noun, Progress* shown, RejectWriter& rejects);

}  // namespace twinprobe
