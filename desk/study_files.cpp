#include "desk/study_files.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <filesystem>
#include <map>

#include "desk/routes.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

std::string ContentType(const std::string& ext) {
  static const std::map<std::string, std::string> kTypes = {{".html", "text/html; charset=utf-8"},
                                                            {".htm", "text/html; charset=utf-8"},
                                                            {".md", "text/plain; charset=utf-8"},
                                                            {".txt", "text/plain; charset=utf-8"},
                                                            {".csv", "text/plain; charset=utf-8"},
                                                            {".json", "application/json"},
                                                            {".svg", "image/svg+xml"},
                                                            {".png", "image/png"},
                                                            {".pdf", "application/pdf"}};
  auto it = kTypes.find(ext);
  return it == kTypes.end() ? "application/octet-stream" : it->second;
}

}  // namespace

Result<ServedFile> ResolveStudyFile(const std::string& study_dir, const std::string& url_path) {
  const std::string prefix = "/files/";
  if (url_path.rfind(prefix, 0) != 0) return BadInput(url_path, "not a study file", "open files from the desk's links");
  const std::string rel = url_path.substr(prefix.size());
  // Check every part by name first: no "..", ".", empty or hidden parts, no
  // backslashes or NUL; the first part must be materials or reports.
  std::vector<std::string> parts;
  size_t start = 0;
  while (start <= rel.size()) {
    size_t slash = rel.find('/', start);
    if (slash == std::string::npos) slash = rel.size();
    parts.push_back(rel.substr(start, slash - start));
    start = slash + 1;
  }
  if (parts.size() < 2 || (parts[0] != "materials" && parts[0] != "reports"))
    return BadInput(url_path, "only files under materials/ and reports/ are served",
                    "open files from the desk's links");
  for (const std::string& p : parts)
    if (p.empty() || p[0] == '.' || p.find('\\') != std::string::npos || p.find('\0') != std::string::npos)
      return BadInput(url_path, "the path has an empty, hidden or parent part", "open files from the desk's links");
  // Then walk it on disk without following any symbolic link.
  fs::path at = fs::path(study_dir);
  for (size_t i = 0; i < parts.size(); ++i) {
    at /= parts[i];
    struct stat st;
    if (lstat(at.c_str(), &st) != 0)
      return BadInput(url_path, "no such file", "render the materials or the report first");
    if (S_ISLNK(st.st_mode))
      return BadInput(url_path, "the path goes through a symbolic link, which the desk does not follow",
                      "copy the file into the study folder instead of linking it");
    const bool last = i + 1 == parts.size();
    if (last && !S_ISREG(st.st_mode))
      return BadInput(url_path, "not a regular file", "open files from the desk's links");
    if (!last && !S_ISDIR(st.st_mode)) return BadInput(url_path, "no such file", "open files from the desk's links");
    if (last && st.st_size > kMaxServedBytes)
      return BadInput(url_path, "the file is larger than the desk serves", "open it from the study folder");
  }
  return ServedFile{at.string(), ContentType(at.extension().string())};
}

DeskResponse ServeStudyFile(const std::string& study_dir, const std::string& url_path) {
  auto file = ResolveStudyFile(study_dir, url_path);
  if (!file.ok()) return ErrorPage(404, "", "This file cannot be shown: " + file.error().Message());
  // O_NOFOLLOW: a link swapped in after the walk above is not followed either.
  int fd = ::open(file.value().path.c_str(), O_RDONLY | O_NOFOLLOW | O_CLOEXEC);
  if (fd < 0) return ErrorPage(404, "", "This file cannot be opened.");
  DeskResponse r;
  char buf[65536];
  ssize_t n;
  while ((n = ::read(fd, buf, sizeof buf)) > 0 && static_cast<int64_t>(r.body.size()) <= kMaxServedBytes)
    r.body.append(buf, static_cast<size_t>(n));
  ::close(fd);
  r.content_type = file.value().content_type;
  // A served document runs no script and loads nothing, whatever it holds.
  r.headers.push_back(
      {"Content-Security-Policy", "sandbox; default-src 'none'; style-src 'unsafe-inline'; img-src data:"});
  return r;
}

}  // namespace twinprobe
