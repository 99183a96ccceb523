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
#include "core/status.h"

namespace twinprobe {

// SHA-256 of the file's bytes, hex; a bad-input error when it cannot be read.
Result<std::string> FileSha256(const std::string& path);
// Size in bytes (0 when unknown), for progress bars.
int64_t FileSize(const std::string& path);

// Columns a reject file adds in front of the original ones. Importers skip
// columns named reject_* so a corrected reject file imports as it is.
bool IsRejectColumn(const std::string& column);

// Writes rejected rows: reject_line, reject_reason, then the original
// columns, as RFC 4180 CSV with CRLF line ends. Opens the file at the first
// row, so nothing is written when no row is rejected.
class RejectWriter {
 public:
  RejectWriter(std::string path, std::vector<std::string> header);
  // A bad-input error when the file cannot be written.
  Status Add(int64_t line, const std::string& reason, const std::vector<std::string>& fields);
  Status Close();
  int64_t rows() const { return rows_; }
  const std::string& path() const { return path_; }

 private:
  std::string path_;
  std::vector<std::string> header_;
  std::unique_ptr<std::ofstream> out_;
  int64_t rows_ = 0;
};

// The default reject file for `path`: "FILE.rejects.csv".
std::string DefaultRejectPath(const std::string& path);

}  // namespace twinprobe
