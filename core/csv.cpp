#include "core/csv.h"

#include <fstream>
#include <sstream>

namespace twinprobe {
namespace {

// True when `s` is well-formed UTF-8 (RFC 3629: no overlongs, no surrogates).
bool IsValidUtf8(const std::string& s) {
  size_t i = 0, n = s.size();
  while (i < n) {
    unsigned char c = static_cast<unsigned char>(s[i]);
    if (c < 0x80) { ++i; continue; }
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

}  // namespace

CsvReader::CsvReader(std::istream& in, std::string name) : in_(in), name_(std::move(name)) {}

int CsvReader::Get() {
  int c = in_.get();
  if (c == '\n') {
    ++line_;
    col_ = 0;
  } else if (c != EOF) {
    ++col_;
  }
  return c;
}

int CsvReader::Peek() { return in_.peek(); }

bool CsvReader::Next(CsvRecord& out) {
  if (error_) return false;
  if (!started_) {
    started_ = true;
    if (Peek() == 0xEF) {  // UTF-8 byte-order mark
      char bom[3];
      in_.read(bom, 3);
      if (in_.gcount() != 3 || static_cast<unsigned char>(bom[1]) != 0xBB ||
          static_cast<unsigned char>(bom[2]) != 0xBF) {
        error_ = BadInput(name_ + ":1:1", "the file starts with bytes that are not UTF-8", "save it as UTF-8 CSV");
        return false;
      }
    }
  }
  out.fields.clear();
  for (;;) {
    // Skip blank lines between records.
    int c = Peek();
    if (c == EOF) return false;
    if (c == '\r' || c == '\n') {
      Get();
      continue;
    }
    break;
  }
  out.line = line_;
  std::string field;
  for (;;) {
    int c = Peek();
    int64_t field_line = line_, field_col = col_ + 1;
    auto fail = [&](const std::string& what, const std::string& fix) {
      error_ = BadInput(name_ + ":" + std::to_string(field_line) + ":" + std::to_string(field_col), what, fix);
      return false;
    };
    field.clear();
    if (c == '"') {
      Get();
      for (;;) {
        int q = Get();
        if (q == EOF) return fail("a quoted field is never closed", "add the closing double quote");
        if (q == '"') {
          if (Peek() == '"') {
            Get();
            field += '"';
            continue;
          }
          break;
        }
        if (q == 0) return fail("the field holds a NUL byte", "remove the NUL byte; is this really a CSV file?");
        field += static_cast<char>(q);
      }
      int after = Peek();
      if (after != ',' && after != '\n' && after != '\r' && after != EOF)
        return fail("text follows a closing quote", "quote the whole field and double any quote inside it");
    } else {
      for (;;) {
        int u = Peek();
        if (u == ',' || u == '\n' || u == '\r' || u == EOF) break;
        if (u == '"')
          return fail("a double quote inside an unquoted field",
                      "quote the whole field and write the quote as \"\"");
        if (u == 0) return fail("the field holds a NUL byte", "remove the NUL byte; is this really a CSV file?");
        field += static_cast<char>(Get());
      }
    }
    if (!IsValidUtf8(field)) return fail("the field is not valid UTF-8", "save the file as UTF-8 CSV");
    out.fields.push_back(field);
    int sep = Get();
    if (sep == ',') continue;
    if (sep == '\r') {
      if (Peek() == '\n') Get();
      return true;
    }
    return true;  // '\n' or EOF
  }
}

int CsvTable::Column(const std::string& name) const {
  for (size_t i = 0; i < header.size(); ++i)
    if (header[i] == name) return static_cast<int>(i);
  return -1;
}

namespace {

Result<CsvTable> ReadCsvStream(std::istream& in, const std::string& name) {
  CsvReader reader(in, name);
  CsvTable table;
  CsvRecord rec;
  if (!reader.Next(rec)) {
    if (reader.error()) return *reader.error();
    return BadInput(name + ":1", "the file is empty", "the first line must name the columns");
  }
  table.header = rec.fields;
  for (size_t i = 0; i < table.header.size(); ++i) {
    if (table.header[i].empty())
      return BadInput(name + ":1", "column " + std::to_string(i + 1) + " has no name", "name every column");
    for (size_t j = 0; j < i; ++j)
      if (table.header[j] == table.header[i])
        return BadInput(name + ":1", "the column '" + table.header[i] + "' appears twice", "rename one of them");
  }
  while (reader.Next(rec)) {
    if (rec.fields.size() != table.header.size())
      return BadInput(name + ":" + std::to_string(rec.line),
                      "the row has " + std::to_string(rec.fields.size()) + " fields but the header has " +
                          std::to_string(table.header.size()),
                      "check for a missing or extra comma, or quote fields that contain commas");
    table.rows.push_back(rec);
  }
  if (reader.error()) return *reader.error();
  return table;
}

}  // namespace

Result<CsvTable> ReadCsvFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  return ReadCsvStream(in, path);
}

Result<CsvTable> ReadCsvText(const std::string& text, const std::string& name) {
  std::istringstream in(text);
  return ReadCsvStream(in, name);
}

std::string CsvQuote(const std::string& field) {
  if (field.find_first_of(",\"\r\n") == std::string::npos) return field;
  std::string out = "\"";
  for (char c : field) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

}  // namespace twinprobe
