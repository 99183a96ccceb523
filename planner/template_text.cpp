#include "planner/template_text.h"

#include <filesystem>
#include <fstream>
#include <sstream>

#include "core/suggest.h"
#include "planner/name_pools.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

constexpr int kMaxIncludeDepth = 8;

class TemplateReader {
 public:
  explicit TemplateReader(std::string study_dir) : dir_(std::move(study_dir)) {
    std::error_code ec;
    root_ = fs::weakly_canonical(fs::absolute(dir_), ec);
  }

  // Reads `rel` (as written at `where`, "" for the top level) into `out`.
  Status Read(const std::string& rel, const std::string& where, int depth, std::vector<TemplateSegment>& out);

 private:
  std::string Shown(const std::string& rel) const { return (fs::path(dir_) / rel).string(); }
  Status Resolve(const std::string& rel, const std::string& where, fs::path& resolved) const;

  std::string dir_;
  fs::path root_;
  std::vector<std::string> stack_;  // files being read, for cycles
};

Status TemplateReader::Resolve(const std::string& rel, const std::string& where, fs::path& resolved) const {
  fs::path p(rel);
  bool dotdot = false;
  for (const auto& part : p) dotdot = dotdot || part == "..";
  const std::string fix = "keep templates and the files they include inside the study folder";
  if (rel.empty() || p.is_absolute() || dotdot)
    return BadInput(where, "the template file '" + rel + "' is outside the study folder", fix);
  std::error_code ec;
  fs::path full = fs::weakly_canonical(fs::absolute(fs::path(dir_) / p), ec);
  auto rel_to_root = full.lexically_relative(root_);
  if (ec || rel_to_root.empty() || *rel_to_root.begin() == "..")
    return BadInput(where, "the template file '" + rel + "' resolves outside the study folder (a symbolic link?)", fix);
  if (!fs::is_regular_file(full))
    return BadInput(where, "the template file '" + rel + "' does not exist in the study folder", "create it or fix the path");
  resolved = full;
  return {};
}

Status TemplateReader::Read(const std::string& rel, const std::string& where, int depth,
                            std::vector<TemplateSegment>& out) {
  const std::string shown = Shown(rel);
  if (depth > kMaxIncludeDepth)
    return BadInput(where, "includes nest deeper than " + std::to_string(kMaxIncludeDepth) + " levels",
                    "flatten the includes");
  fs::path full;
  if (Status s = Resolve(rel, where.empty() ? shown : where, full); !s.ok()) return s;
  for (const auto& open : stack_)
    if (open == full.string()) return BadInput(where, "'" + rel + "' includes itself (an include cycle)", "remove the cycle");
  std::ifstream in(full, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  const std::string text = ss.str();
  stack_.push_back(full.string());

  int line = 1, col = 1, lit_line = 1, lit_col = 1;
  std::string literal;
  auto flush = [&] {
    if (!literal.empty()) out.push_back({false, literal, shown, lit_line, lit_col});
    literal.clear();
  };
  for (size_t i = 0; i < text.size();) {
    unsigned char c = static_cast<unsigned char>(text[i]);
    if (c < 0x20 && c != '\n' && c != '\r' && c != '\t')
      return BadInput(shown + ":" + std::to_string(line) + ":" + std::to_string(col),
                      "the template holds a control character (byte " + std::to_string(c) + ")", "remove it");
    if (text.compare(i, 2, "{{") != 0) {
      if (literal.empty()) lit_line = line, lit_col = col;
      literal += text[i];
      if (c == '\n') ++line, col = 1;
      else if ((c & 0xC0) != 0x80) ++col;  // count UTF-8 characters, not bytes
      ++i;
      continue;
    }
    const std::string at = shown + ":" + std::to_string(line) + ":" + std::to_string(col);
    size_t close = text.find("}}", i + 2);
    size_t newline = text.find('\n', i + 2);
    if (close == std::string::npos || (newline != std::string::npos && newline < close))
      return BadInput(at, "'{{' is not closed by '}}' on the same line", "close the placeholder, e.g. {{full_name}}");
    std::string inner = text.substr(i + 2, close - i - 2);
    size_t b = inner.find_first_not_of(' '), e = inner.find_last_not_of(' ');
    inner = b == std::string::npos ? "" : inner.substr(b, e - b + 1);
    int field_line = line, field_col = col;
    col += static_cast<int>(close + 2 - i);
    i = close + 2;
    if (inner.rfind("include ", 0) == 0) {
      std::string target = inner.substr(8);
      size_t tb = target.find_first_not_of(' ');
      target = tb == std::string::npos ? "" : target.substr(tb);
      if (target.size() >= 2 && target.front() == '"' && target.back() == '"') target = target.substr(1, target.size() - 2);
      flush();
      if (Status s = Read(target, at, depth + 1, out); !s.ok()) return s;
      continue;
    }
    if (!IsFieldName(inner))
      return BadInput(at, "'{{" + inner + "}}' is not a field name",
                      "write {{field}} with letters, digits and '_', or {{include path}}");
    flush();
    out.push_back({true, inner, shown, field_line, field_col});
  }
  flush();
  stack_.pop_back();
  return {};
}

}  // namespace

std::map<std::string, const TemplateSegment*> TemplateDoc::FieldUses() const {
  std::map<std::string, const TemplateSegment*> uses;
  for (const auto& s : segments)
    if (s.is_field) uses.emplace(s.text, &s);
  return uses;
}

Result<TemplateDoc> LoadTemplate(const std::string& study_dir, const std::string& rel_path) {
  TemplateDoc doc;
  doc.path = rel_path;
  TemplateReader reader(study_dir);
  if (Status s = reader.Read(rel_path, "", 0, doc.segments); !s.ok()) return s.error();
  return doc;
}

namespace {

Error UnknownField(const TemplateSegment& s, const std::map<std::string, std::string>& fields) {
  std::vector<std::string> names;
  for (const auto& [k, v] : fields) names.push_back(k);
  return BadInput(s.file + ":" + std::to_string(s.line) + ":" + std::to_string(s.column),
                  "unknown field '" + s.text + "'" + DidYouMean(s.text, names),
                  "use a field of the profile or the vacancy (see docs/render.md)");
}

}  // namespace

Result<std::string> FillTemplate(const TemplateDoc& doc, const std::map<std::string, std::string>& fields,
                                 ValueEscaper escape) {
  std::string out;
  for (const auto& s : doc.segments) {
    if (!s.is_field) {
      out += s.text;
      continue;
    }
    auto it = fields.find(s.text);
    if (it == fields.end()) return UnknownField(s, fields);
    out += escape ? escape(it->second) : it->second;
  }
  return out;
}

Result<std::string> FillTemplateWithTokens(const TemplateDoc& doc, const std::map<std::string, std::string>& fields,
                                           std::vector<std::string>& values) {
  std::string out;
  for (const auto& s : doc.segments) {
    if (!s.is_field) {
      out += s.text;
      continue;
    }
    auto it = fields.find(s.text);
    if (it == fields.end()) return UnknownField(s, fields);
    out += '\x01' + std::to_string(values.size()) + '\x02';
    values.push_back(it->second);
  }
  return out;
}

}  // namespace twinprobe
