#include "collector/mail_source.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "collector/mail_header.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

bool ReadWhole(const std::string& path, std::string& out) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return false;
  std::stringstream ss;
  ss << in.rdbuf();
  out = ss.str();
  return true;
}

bool IsEscapedFrom(std::string_view line) {
  size_t k = 0;
  while (k < line.size() && line[k] == '>') ++k;
  return k > 0 && line.substr(k).rfind("From ", 0) == 0;
}

// The empty line before a separator (or at the end of the file) belongs to
// the mbox, not to the message: removes it when `raw` ends with one.
void DropSeparatorLine(std::string& raw) {
  if (raw.size() >= 2 && raw.compare(raw.size() - 2, 2, "\n\n") == 0)
    raw.pop_back();
  else if (raw.size() >= 4 && raw.compare(raw.size() - 4, 4, "\r\n\r\n") == 0)
    raw.resize(raw.size() - 2);
}

// Why a file is not an mbox, in the terms of what it most likely is: a
// single message file and a compressed or UTF-16 export each get their own
// fix, since "no 'From ' line" reads as wrong to someone who sees "From:".
Error NotAnMbox(const std::string& path, std::string_view text) {
  const std::string where = path + ":1:1";
  if (text.rfind("\x1F\x8B", 0) == 0)
    return BadInput(where, "this is a gzip-compressed file, not an mbox file", "unpack it first (gunzip) and pass the result");
  if (text.rfind("\xFF\xFE", 0) == 0 || text.rfind("\xFE\xFF", 0) == 0)
    return BadInput(where, "this file is UTF-16 text, not an mbox file",
                    "export the mailbox in mbox format (mail clients write it as 8-bit text)");
  size_t colon = text.find(':');
  size_t name_end = 0;
  while (name_end < text.size() && name_end < 80 && text[name_end] > ' ' && text[name_end] < 0x7F && text[name_end] != ':')
    ++name_end;
  if (colon == name_end && name_end > 0 && name_end < text.size())
    return BadInput(where,
                    "this is a single message, not an mbox file: it starts with a '" +
                        std::string(text.substr(0, name_end)) + ":' header, not a 'From ' line",
                    "put message files in the new/ folder of a Maildir and pass that with --maildir, or export the "
                    "mailbox in mbox format");
  return BadInput(where, "this is not an mbox file: it does not start with a 'From ' line",
                  "pass a Maildir folder with --maildir, or export the mailbox in mbox format");
}

}  // namespace

std::string CanonicalRaw(const std::string& raw) {
  std::string out;
  out.reserve(raw.size());
  for (size_t i = 0; i < raw.size(); ++i) {
    if (raw[i] == '\r' && i + 1 < raw.size() && raw[i + 1] == '\n') continue;
    out += raw[i];
  }
  while (!out.empty() && out.back() == '\n') out.pop_back();
  out += '\n';
  return out;
}

Result<std::vector<RawMail>> ReadMbox(const std::string& path) {
  std::string text;
  if (fs::is_directory(path))
    return BadInput(path, "this is a folder, not an mbox file", "pass a Maildir folder with --maildir");
  if (!ReadWhole(path, text)) return BadInput(path, "cannot read the mbox file", "check the path");
  std::vector<RawMail> out;
  // A UTF-8 byte order mark (an editor's, never mail's) is skipped, so no
  // response is lost to it; line numbers are unchanged.
  if (text.rfind("\xEF\xBB\xBF", 0) == 0) text.erase(0, 3);
  if (text.empty()) return out;
  if (text.rfind("From ", 0) != 0) return NotAnMbox(path, text);
  RawMail* current = nullptr;
  bool previous_empty = true;
  size_t pos = 0;
  int64_t line_no = 0;
  while (pos < text.size()) {
    size_t eol = text.find('\n', pos);
    size_t next = eol == std::string::npos ? text.size() : eol + 1;
    std::string_view line(text.data() + pos, next - pos);
    std::string_view bare = line;
    while (!bare.empty() && (bare.back() == '\n' || bare.back() == '\r')) bare.remove_suffix(1);
    ++line_no;
    bool separator = bare.rfind("From ", 0) == 0 && previous_empty &&
                     (current == nullptr || ParseMboxFromLineDate(bare).has_value());
    if (separator) {
      if (current) DropSeparatorLine(current->raw);
      out.push_back({"", path + ":" + std::to_string(line_no), ParseMboxFromLineDate(bare)});
      current = &out.back();
    } else if (current) {
      if (IsEscapedFrom(bare))
        current->raw.append(line.substr(1));
      else
        current->raw.append(line);
    }
    previous_empty = bare.empty();
    pos = next;
  }
  if (current && previous_empty) DropSeparatorLine(current->raw);  // the file ends with one
  return out;
}

Result<std::vector<RawMail>> ReadMaildir(const std::string& dir) {
  if (fs::exists(dir) && !fs::is_directory(dir))
    return BadInput(dir, "this is a file, not a Maildir folder", "pass an mbox file with --mbox");
  if (!fs::is_directory(dir)) return BadInput(dir, "no such folder", "check the path of the Maildir folder");
  if (!fs::is_directory(fs::path(dir) / "cur") || !fs::is_directory(fs::path(dir) / "new"))
    return BadInput(dir, "this is not a Maildir folder: it has no cur/ and new/ folders",
                    "pass the folder that holds cur/ and new/, or an mbox file with --mbox");
  std::vector<RawMail> out;
  for (const char* sub : {"new", "cur"}) {
    std::vector<fs::path> files;
    for (const auto& entry : fs::directory_iterator(fs::path(dir) / sub))
      if (entry.is_regular_file() && entry.path().filename().string().rfind('.', 0) != 0) files.push_back(entry.path());
    std::sort(files.begin(), files.end());
    for (const auto& f : files) {
      RawMail m;
      if (!ReadWhole(f.string(), m.raw))
        return BadInput(f.string(), "cannot read this message file", "check its permissions");
      m.where = f.string();
      std::string name = f.filename().string();
      size_t digits = 0;
      while (digits < name.size() && std::isdigit(static_cast<unsigned char>(name[digits]))) ++digits;
      if (digits > 0 && digits <= 12 && digits < name.size() && name[digits] == '.')
        m.envelope_time = std::stoll(name.substr(0, digits));
      out.push_back(std::move(m));
    }
  }
  return out;
}

}  // namespace twinprobe
