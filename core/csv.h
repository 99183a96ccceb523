#pragma once
// RFC 4180 CSV reading: quoted fields with embedded commas, quotes ("") and
// newlines; CRLF or LF line ends; a UTF-8 byte-order mark is skipped. Records
// are read one at a time so million-row files stream in constant memory.
#include <cstdint>
#include <istream>
#include <memory>
#include <string>
#include <vector>

#include "core/status.h"

namespace twinprobe {

struct CsvRecord {
  std::vector<std::string> fields;
  int64_t line = 0;  // line on which the record starts (1-based)
};

class CsvReader {
 public:
  // `name` is used in error positions ("FILE:LINE:COL").
  CsvReader(std::istream& in, std::string name);

  // Reads the next record into `out`. Returns true on success, false at the
  // end of input; a malformed record (a quote inside an unquoted field, text
  // after a closing quote, an unterminated quote, a NUL byte, invalid UTF-8)
  // sets error() and returns false. Blank lines are skipped.
  bool Next(CsvRecord& out);
  const std::optional<Error>& error() const { return error_; }
  const std::string& name() const { return name_; }

 private:
  int Get();
  int Peek();

  std::istream& in_;
  std::string name_;
  int64_t line_ = 1;
  int64_t col_ = 0;
  bool started_ = false;
  std::optional<Error> error_;
};

// A whole CSV with a header row, for files that fit in memory.
struct CsvTable {
  std::vector<std::string> header;
  std::vector<CsvRecord> rows;
  // Index of a header column, or -1.
  int Column(const std::string& name) const;
};

// Reads the file at `path`. Every record must have as many fields as the
// header; errors name FILE:LINE.
Result<CsvTable> ReadCsvFile(const std::string& path);
Result<CsvTable> ReadCsvText(const std::string& text, const std::string& name);

// Quotes a field for writing when it needs it (RFC 4180).
std::string CsvQuote(const std::string& field);

}  // namespace twinprobe
