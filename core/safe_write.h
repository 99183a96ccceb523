#pragma once
// Files the tool writes, created without following symlinks.
//
// A link planted where an output goes (export/probes.csv -> ~/.bashrc, a
// reject file, materials/P00001.html, reports/report.html) must not make the
// tool write outside the study. So every output is written to a new
// temporary file beside the target, created with O_CREAT|O_EXCL|O_NOFOLLOW
// (a link, or anything else already there, makes the creation fail instead
// of being followed), and renamed over the target on Commit. rename()
// replaces a link at the target itself and never writes through it; a
// reader never sees a half-written file; a killed run leaves at most a
// "TARGET.tmp-XXXXXX" file beside the target, never a truncated target.
#include <memory>
#include <ostream>
#include <string>

#include "core/status.h"

namespace twinprobe {

class SafeFile {
 public:
  // Creates the temporary file beside `target` (in the same folder, so the
  // rename stays on one file system). Errors: the folder is missing or not
  // writable (bad input, naming `target`).
  static Result<std::unique_ptr<SafeFile>> Create(const std::string& target);
  ~SafeFile();  // removes the temporary file unless Commit() ran
  SafeFile(const SafeFile&) = delete;
  SafeFile& operator=(const SafeFile&) = delete;

  std::ostream& out() { return *stream_; }
  const std::string& target() const { return target_; }
  // Flushes, syncs and renames the temporary file onto the target.
  // Errors: a failed write (disk full) or rename; the temporary is removed.
  Status Commit();

 private:
  SafeFile(std::string target, std::string temp, int fd);
  class Buffer;
  std::string target_, temp_;
  int fd_ = -1;
  std::unique_ptr<Buffer> buffer_;
  std::unique_ptr<std::ostream> stream_;
  bool committed_ = false;
};

// The whole of `content` written to `target` through a SafeFile.
Status WriteFileSafely(const std::string& target, const std::string& content);

// A folder written as a whole: files go into a new temporary folder beside
// `target` (mkdtemp: created fresh, never an existing one), and Commit
// puts it in place of `target` in one rename (an existing folder is swapped
// out atomically with renameat2(RENAME_EXCHANGE) and then removed). A killed
// run leaves "TARGET.tmp-XXXXXX" beside the target and the old folder whole.
class SafeFolder {
 public:
  // Errors: the parent folder is missing or not writable; `target` is a
  // symbolic link or a file that is not a folder (bad input).
  static Result<std::unique_ptr<SafeFolder>> Create(const std::string& target);
  ~SafeFolder();  // removes the temporary folder unless Commit() ran
  SafeFolder(const SafeFolder&) = delete;
  SafeFolder& operator=(const SafeFolder&) = delete;

  const std::string& path() const { return temp_; }  // where to write the files now
  const std::string& target() const { return target_; }
  Status Commit();

 private:
  SafeFolder(std::string target, std::string temp) : target_(std::move(target)), temp_(std::move(temp)) {}
  std::string target_, temp_;
  bool committed_ = false;
};

}  // namespace twinprobe
