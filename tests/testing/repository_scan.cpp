#include "testing/repository_scan.h"

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <regex>
#include <sstream>

namespace twinprobe::testing {
namespace {

namespace fs = std::filesystem;

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) out.push_back(line);
  return out;
}

std::string Trimmed(const std::string& s) {
  size_t b = s.find_first_not_of(" \t\r");
  if (b == std::string::npos) return "";
  return s.substr(b, s.find_last_not_of(" \t\r") - b + 1);
}

bool IsCommentLine(const std::string& line) {
  std::string t = Trimmed(line);
  return t.rfind("//", 0) == 0 || t.rfind("*", 0) == 0 || t.rfind("/*", 0) == 0 || t.rfind("#", 0) == 0;
}

std::string TopFolder(const std::string& path) {
  size_t slash = path.find('/');
  return slash == std::string::npos ? "" : path.substr(0, slash);
}

bool IsSource(const std::string& path) {
  for (const char* ext : {".h", ".cpp", ".cc", ".hpp"})
    if (path.size() > std::string(ext).size() && path.compare(path.size() - std::string(ext).size(), std::string::npos, ext) == 0)
      return true;
  return false;
}

// Layer of each module folder (docs/architecture.md, "Layers"); templates is a
// leaf of embedded text that any layer may read.
const std::map<std::string, int>& Layers() {
  static const std::map<std::string, int> layers{{"core", 0},     {"stats", 0},  {"templates", 0},
                                                 {"planner", 1},  {"collector", 1}, {"analysis", 2},
                                                 {"report", 3},   {"desk", 4},   {"cli", 5}};
  return layers;
}

constexpr const char* kOrder = "(order: core, stats < planner, collector < analysis < report < desk < cli)";

std::string ReadAll(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

std::vector<std::string> TrackedPaths(const std::string& root) {
  std::vector<std::string> paths;
  std::string cmd = "git -C '" + root + "' ls-files 2>/dev/null";
  if (FILE* p = popen(cmd.c_str(), "r")) {
    std::array<char, 4096> buf;
    std::string all;
    while (size_t n = fread(buf.data(), 1, buf.size(), p)) all.append(buf.data(), n);
    pclose(p);
    paths = Lines(all);
  }
  if (!paths.empty()) return paths;
  for (auto it = fs::recursive_directory_iterator(root); it != fs::recursive_directory_iterator(); ++it) {
    std::string name = it->path().filename().string();
    if (it->is_directory() && (name.rfind("build", 0) == 0 || name.rfind('.', 0) == 0 || name == "demo-study")) {
      it.disable_recursion_pending();
      continue;
    }
    if (it->is_regular_file()) paths.push_back(fs::relative(it->path(), root).generic_string());
  }
  return paths;
}

}  // namespace

std::vector<RepositoryFile> RepositoryFiles() {
  const std::string root = TWINPROBE_SOURCE_DIR;
  std::vector<RepositoryFile> files;
  for (const auto& rel : TrackedPaths(root)) {
    fs::path p = fs::path(root) / rel;
    std::error_code ec;
    if (!fs::is_regular_file(p, ec) || fs::file_size(p, ec) > (4u << 20)) continue;
    std::string text = ReadAll(p);
    if (text.find('\0') != std::string::npos) continue;  // binary
    files.push_back({rel, std::move(text)});
  }
  return files;
}

std::vector<std::string> FindOutsideReferences(const std::string& path, const std::string& text) {
  // Spelled in pieces so this file does not report itself.
  static const std::vector<std::string> kNames{std::string("METH") + "ODS.md", std::string("DES") + "IGN.md",
                                               std::string("STY") + "LE.md", std::string("BUILD") + "-NOTES",
                                               std::string("../sha") + "red/", std::string("/work") + "/"};
  std::vector<std::string> out;
  auto lines = Lines(text);
  for (size_t i = 0; i < lines.size(); ++i)
    for (const auto& name : kNames)
      if (lines[i].find(name) != std::string::npos) {
        out.push_back(path + ":" + std::to_string(i + 1) + ": refers to '" + name +
                      "', a file outside the repository: cite the published source itself");
        break;
      }
  return out;
}

std::vector<std::string> FindLayerViolations(const std::string& path, const std::string& text) {
  std::vector<std::string> out;
  auto own = Layers().find(TopFolder(path));
  if (own == Layers().end() || !IsSource(path)) return out;
  static const std::regex include(R"re(^\s*#\s*include\s*"([a-z_]+)/([^"]+)")re");
  auto lines = Lines(text);
  for (size_t i = 0; i < lines.size(); ++i) {
    std::smatch m;
    if (!std::regex_search(lines[i], m, include)) continue;
    auto other = Layers().find(m[1].str());
    if (other == Layers().end() || other->first == own->first || other->first == "templates") continue;
    if (other->second < own->second) continue;
    const char* where = other->second > own->second ? "a module above it " : "a module beside it ";
    out.push_back(path + ":" + std::to_string(i + 1) + ": " + own->first + "/ includes " + m[1].str() + "/" +
                  m[2].str() + ", " + where + kOrder);
  }
  return out;
}

std::vector<std::string> FindCliSqliteCalls(const std::string& path, const std::string& text) {
  std::vector<std::string> out;
  if (TopFolder(path) != "cli" || !IsSource(path)) return out;
  auto lines = Lines(text);
  for (size_t i = 0; i < lines.size(); ++i) {
    const std::string& l = lines[i];
    if (IsCommentLine(l) && l.find("#include") == std::string::npos) continue;
    if (l.find("sqlite3") != std::string::npos)
      out.push_back(path + ":" + std::to_string(i + 1) + ": cli/ calls the SQLite API: go through a function in core/");
  }
  return out;
}

std::vector<std::string> FindSqlOutsideCore(const std::string& path, const std::string& text) {
  std::vector<std::string> out;
  std::string top = TopFolder(path);
  if (top == "core" || Layers().count(top) == 0 || !IsSource(path)) return out;
  static const std::regex sql(
      R"(\b(SELECT\s|INSERT\s+(OR\s+\w+\s+)?INTO\b|UPDATE\s+\w+\s+SET\b|DELETE\s+FROM\b|CREATE\s+(TABLE|INDEX|UNIQUE\s+INDEX|VIEW|TRIGGER)\b)|\b(Prepare|Exec|QueryInt)\()");
  auto lines = Lines(text);
  for (size_t i = 0; i < lines.size(); ++i) {
    if (IsCommentLine(lines[i])) continue;
    if (std::regex_search(lines[i], sql))
      out.push_back(path + ":" + std::to_string(i + 1) + ": SQL outside core/: " + Trimmed(lines[i]));
  }
  return out;
}

}  // namespace twinprobe::testing
