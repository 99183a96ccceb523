#include "core/csv.h"

#include <algorithm>
#include <fstream>
#include <sstream>

#include "core/echoed_value.h"

namespace twinprobe {
namespace {

constexpr size_t kBufferBytes = 1 << 16;

CsvDialect& Dialect() {
  static CsvDialect dialect;
  return dialect;
}

}  // namespace

const CsvDialect& CurrentCsvDialect() { return Dialect(); }
void SetCsvDialect(const CsvDialect& dialect) { Dialect() = dialect; }

std::optional<char> ParseCsvSeparator(const std::string& value) {
  if (value == "," || value == ";" || value == "|") return value[0];
  if (value == "tab" || value == "\t" || value == "\\t") return '\t';
  return std::nullopt;
}

bool IsValidUtf8(const std::string& s) {
  size_t i = 0, n = s.size();
  while (i < n) {
    unsigned char c = static_cast<unsigned char>(s[i]);
    if (c < 0x80) {
      ++i;
      continue;
    }
    int len = (c >> 5) == 6 ? 2 : (c >> 4) == 14 ? 3 : (c >> 3) == 30 ? 4 : 0;
    if (len == 0 || i + len > n) return false;
    uint32_t cp = c & (len == 2 ? 0x1f : len == 3 ? 0x0f : 0x07);
    for (int k = 1; k < len; ++k) {
      unsigned char cc = static_cast<unsigned char>(s[i + k]);
      if ((cc >> 6) != 2) return false;
      cp = (cp << 6) | (cc & 0x3f);
    }
    if ((len == 2 && cp < 0x80) || (len == 3 && cp < 0x800) || (len == 4 && (cp < 0x10000 || cp > 0x10ffff)) ||
        (cp >= 0xd800 && cp <= 0xdfff))
      return false;
    i += len;
  }
  return true;
}

CsvReader::CsvReader(std::istream& in, std::string name)
    : in_(in), name_(std::move(name)), buf_(kBufferBytes), separator_(CurrentCsvDialect().separator) {}

bool CsvReader::Fill() {
  if (!in_) return false;
  in_.read(buf_.data(), static_cast<std::streamsize>(buf_.size()));
  len_ = static_cast<size_t>(in_.gcount());
  pos_ = 0;
  return len_ > 0;
}

int CsvReader::Get() {
  int c = Peek();
  if (c < 0) return c;
  ++pos_;
  ++consumed_;
  if (c == '\n') {
    ++line_;
    col_ = 0;
  } else if (c == '\r') {
    // A lone CR ends a line too (old spreadsheet exports); CRLF counts once,
    // at its LF.
    if (Peek() != '\n') {
      ++line_;
      col_ = 0;
    }
  } else if ((c & 0xC0) != 0x80) {
    ++col_;  // count characters, not UTF-8 continuation bytes
  }
  return c;
}

bool CsvReader::Fail(int64_t line, int64_t col, const std::string& what, const std::string& fix) {
  error_ = BadInput(name_ + ":" + std::to_string(line) + ":" + std::to_string(col), what, fix);
  return false;
}

bool CsvReader::CheckStart() {
  started_ = true;
  int c = Peek();
  if (c == 0xEF) {
    // UTF-8 byte-order mark: three bytes, skipped without counting a column.
    char bom[3] = {0, 0, 0};
    for (char& b : bom) {
      int x = Peek();
      if (x < 0) break;
      b = static_cast<char>(x);
      ++pos_;
      ++consumed_;
    }
    if (static_cast<unsigned char>(bom[1]) != 0xBB || static_cast<unsigned char>(bom[2]) != 0xBF)
      return Fail(1, 1, "the file starts with bytes that are not UTF-8", "save it as UTF-8 CSV");
  } else if (c == 0xFF || c == 0xFE) {
    return Fail(1, 1, "the file is UTF-16 (it starts with a UTF-16 byte-order mark)",
                "save it as UTF-8 CSV (in a spreadsheet: CSV UTF-8)");
  }
  return true;
}

bool CsvReader::Next(CsvRecord& out) {
  if (error_) return false;
  if (!started_ && !CheckStart()) return false;
  for (;;) {  // skip blank lines between records
    int c = Peek();
    if (c < 0) return false;
    if (c != '\r' && c != '\n') break;
    Get();
  }
  out.line = line_;
  size_t count = 0;
  for (;;) {
    if (count == out.fields.size()) out.fields.emplace_back();
    std::string& field = out.fields[count++];
    field.clear();
    const int64_t field_line = line_, field_col = col_ + 1;
    bool ascii = true;
    int c = Peek();
    if (c == '"') {
      Get();
      for (;;) {
        int q = Get();
        if (q < 0)
          return Fail(field_line, field_col, "a quoted field is never closed", "add the closing double quote");
        if (q == '"') {
          if (Peek() != '"') break;
          Get();
        } else if (q == 0) {
          return Fail(line_, col_, "the field holds a NUL byte", "remove the NUL byte; is this really a CSV file?");
        }
        ascii = ascii && q < 0x80;
        field += static_cast<char>(q);
      }
      int after = Peek();
      if (after != separator_ && after != '\n' && after != '\r' && after >= 0)
        return Fail(line_, col_ + 1, "text follows a closing quote",
                    "quote the whole field and double any quote inside it");
    } else {
      for (;;) {
        int u = Peek();
        if (u == separator_ || u == '\n' || u == '\r' || u < 0) break;
        if (u == '"')
          return Fail(line_, col_ + 1, "a double quote inside an unquoted field",
                      "quote the whole field and write the quote as \"\"");
        if (u == 0)
          return Fail(line_, col_ + 1, "the field holds a NUL byte", "remove the NUL byte; is this really a CSV file?");
        ascii = ascii && u < 0x80;
        field += static_cast<char>(Get());
      }
    }
    if (!ascii && !IsValidUtf8(field))
      return Fail(field_line, field_col, "the field is not valid UTF-8", "save the file as UTF-8 CSV");
    int sep = Get();
    if (sep == separator_) continue;
    if (sep == '\r' && Peek() == '\n') Get();
    out.fields.resize(count);
    return true;  // line end or end of input
  }
}

Result<std::vector<std::string>> ReadCsvHeader(CsvReader& reader) {
  CsvRecord rec;
  if (!reader.Next(rec)) {
    if (reader.error()) return *reader.error();
    return BadInput(reader.name() + ":1", "the file is empty", "the first line must name the columns");
  }
  const std::string where = reader.name() + ":" + std::to_string(rec.line);
  if (rec.fields.size() == 1) {
    // A spreadsheet set to a locale with a decimal comma saves ';'-separated
    // "CSV"; read with commas its header is one column, and every importer
    // would then report a required column missing that is plainly there.
    const std::string& only = rec.fields[0];
    const auto semicolons = std::count(only.begin(), only.end(), ';');
    const auto tabs = std::count(only.begin(), only.end(), '\t');
    if (semicolons + tabs > 0) {
      const bool tab = tabs > semicolons;
      std::string fix = "save it as CSV with commas";
      if (CurrentCsvDialect().separator_option) fix += tab ? ", or pass --separator tab" : ", or pass --separator ';'";
      return BadInput(where, tab ? "the file looks tab-separated" : "the file looks semicolon-separated", fix);
    }
  }
  if (rec.fields.size() > kMaxCsvColumns)
    return BadInput(where, "the header has " + WithThousands(rec.fields.size()) + " columns, more than the " +
                               WithThousands(kMaxCsvColumns) + " a file may have",
                    "keep only the columns the command reads");
  for (size_t i = 0; i < rec.fields.size(); ++i) {
    if (rec.fields[i].empty())
      return BadInput(where, "column " + std::to_string(i + 1) + " has no name", "name every column");
    for (size_t j = 0; j < i; ++j)
      if (rec.fields[j] == rec.fields[i])
        return BadInput(where, "the column '" + Echoed(rec.fields[i]) + "' appears twice", "rename one of them");
  }
  return rec.fields;
}

Status CheckFieldCount(const CsvRecord& record, size_t header_fields, const std::string& name) {
  if (record.fields.size() == header_fields) return {};
  return BadInput(name + ":" + std::to_string(record.line),
                  "the row has " + std::to_string(record.fields.size()) + " field" +
                      (record.fields.size() == 1 ? "" : "s") + " but the header has " +
                      std::to_string(header_fields),
                  "check for a missing or extra comma, or quote fields that contain commas");
}

int FindColumn(const std::vector<std::string>& header, const std::string& column) {
  for (size_t i = 0; i < header.size(); ++i)
    if (header[i] == column) return static_cast<int>(i);
  return -1;
}

namespace {

Result<CsvTable> ReadCsvStream(std::istream& in, const std::string& name, size_t kept_rows = SIZE_MAX) {
  CsvReader reader(in, name);
  CsvTable table;
  auto header = ReadCsvHeader(reader);
  if (!header.ok()) return header.error();
  table.header = std::move(header).value();
  CsvRecord rec;
  while (reader.Next(rec)) {
    Status s = CheckFieldCount(rec, table.header.size(), name);
    if (!s.ok()) return s.error();
    if (table.row_count++ < kept_rows) table.rows.push_back(rec);
  }
  if (reader.error()) return *reader.error();
  return table;
}

}  // namespace

Result<CsvTable> ReadCsvFile(const std::string& path, size_t kept_rows) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  return ReadCsvStream(in, path, kept_rows);
}

Result<CsvTable> ReadCsvText(const std::string& text, const std::string& name) {
  std::istringstream in(text);
  return ReadCsvStream(in, name);
}

std::string CsvQuote(const std::string& field) {
  bool edge_space = !field.empty() && (field.front() == ' ' || field.back() == ' ');
  if (!edge_space && field.find_first_of(",\"\r\n") == std::string::npos) return field;
  std::string out = "\"";
  for (char c : field) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

}  // namespace twinprobe
