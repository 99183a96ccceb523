#pragma once
// RFC 4180 CSV reading: quoted fields with embedded commas, quotes ("") and
// line breaks; CRLF, LF or a lone CR as record ends; a UTF-8 byte-order mark
// at the very start is skipped. Records are read one at a time through a
// fixed buffer, so million-row files stream in constant memory.
//
// Beyond RFC 4180 (documented in docs/import.md):
//   - blank lines between records are skipped (spreadsheets leave them);
//   - a field must be valid UTF-8 (RFC 3629) and may not hold a NUL byte;
//   - spaces are data: " a" is kept as " a", and a quote after a space is an
//     error, as RFC 4180 asks.
//   - the separator is a comma unless the command was told otherwise
//     (`import … --separator ';'`, see CsvDialect below); a header that reads
//     as one column holding ';' or a tab is refused, naming the separator.
// Positions in messages are FILE:LINE:COL, both 1-based; LINE counts line
// breaks (a quoted line break inside a field counts too, so positions match
// what an editor shows) and COL counts characters (UTF-8 code points).
#include <cstddef>
#include <cstdint>
#include <istream>
#include <optional>
#include <string>
#include <vector>

#include "core/status.h"

namespace twinprobe {

// The separator every CSV reader of this process uses, and whether the
// running command offers `--separator` (then the refusal of a semicolon- or
// tab-separated header names the option). One process runs one command, so
// this is set once, by the command line (cli/import_cmds.cpp), before any
// file is read; everything else reads commas.
struct CsvDialect {
  char separator = ',';
  bool separator_option = false;
};
const CsvDialect& CurrentCsvDialect();
void SetCsvDialect(const CsvDialect& dialect);

// The separator a `--separator` value names: ",", ";", "|", "tab" or a tab
// character; nullopt for anything else.
std::optional<char> ParseCsvSeparator(const std::string& value);

struct CsvRecord {
  std::vector<std::string> fields;
  int64_t line = 0;  // line on which the record starts (1-based)
};

class CsvReader {
 public:
  // `name` is used in error positions ("FILE:LINE:COL"). `in` must outlive
  // the reader and should be opened in binary mode. Fields are separated by
  // CurrentCsvDialect().separator.
  CsvReader(std::istream& in, std::string name);

  // Reads the next record into `out` (reusing its strings' storage). Returns
  // true on success, false at the end of input; a malformed record (a quote
  // inside an unquoted field, text after a closing quote, an unterminated
  // quote, a NUL byte, invalid UTF-8, a UTF-16 file) sets error() and
  // returns false. Blank lines are skipped.
  bool Next(CsvRecord& out);
  const std::optional<Error>& error() const { return error_; }
  const std::string& name() const { return name_; }
  // Bytes consumed so far (for progress bars over a file of known size).
  int64_t bytes_consumed() const { return consumed_; }

 private:
  bool Fill();
  int Peek() { return (pos_ < len_ || Fill()) ? static_cast<unsigned char>(buf_[pos_]) : -1; }
  int Get();
  bool Fail(int64_t line, int64_t col, const std::string& what, const std::string& fix);
  bool CheckStart();

  std::istream& in_;
  std::string name_;
  std::vector<char> buf_;
  size_t pos_ = 0, len_ = 0;
  int64_t consumed_ = 0;
  int64_t line_ = 1;
  int64_t col_ = 0;
  bool started_ = false;
  std::optional<Error> error_;
  char separator_ = ',';
};

// The widest header a CSV may have. Every file twinprobe reads needs a few
// dozen columns; a header of 40,000 took 27 s to check, so a wider one is
// refused before its names are compared.
inline constexpr size_t kMaxCsvColumns = 1000;

// Reads and checks a header record: every column named, no name twice, and
// not one column holding ';' or a tab (a file saved with another separator:
// "the file looks semicolon-separated — save it as CSV with commas, or pass
// --separator ';'"). Errors name FILE:LINE (or the reader's error).
Result<std::vector<std::string>> ReadCsvHeader(CsvReader& reader);

// The error for a record whose field count differs from the header's, or OK.
Status CheckFieldCount(const CsvRecord& record, size_t header_fields, const std::string& name);

// Index of `column` in `header`, or -1.
int FindColumn(const std::vector<std::string>& header, const std::string& column);

// A whole CSV with a header row, for files that fit in memory.
struct CsvTable {
  std::vector<std::string> header;
  std::vector<CsvRecord> rows;
  size_t row_count = 0;  // rows in the file (more than rows.size() past a bound)
  // Index of a header column, or -1.
  int Column(const std::string& name) const { return FindColumn(header, name); }
};

// Reads the file at `path`. Every record must have as many fields as the
// header; errors name FILE:LINE. At most `kept_rows` rows are kept in
// `rows`; the rest are read, checked and counted in `row_count` in constant
// memory, so a caller with a bound can name the whole count without paying
// for it.
Result<CsvTable> ReadCsvFile(const std::string& path, size_t kept_rows = SIZE_MAX);
Result<CsvTable> ReadCsvText(const std::string& text, const std::string& name);

// Quotes a field for writing when it needs it (RFC 4180): fields holding a
// comma, a quote, CR or LF, and fields with leading or trailing spaces (so
// no reader trims them away).
std::string CsvQuote(const std::string& field);

// True when `s` is well-formed UTF-8 (RFC 3629: no overlongs, no surrogates,
// nothing above U+10FFFF).
bool IsValidUtf8(const std::string& s);

}  // namespace twinprobe
