#include "collector/snapshot_store.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "core/sha256.h"

namespace twinprobe {
namespace fs = std::filesystem;

std::string SnapshotStore::PathOf(const std::string& sha) const {
  return (fs::path(dir_) / sha.substr(0, 2) / sha).string();
}

Result<std::string> SnapshotStore::Put(std::string_view bytes) const {
  const std::string sha = Sha256Hex(bytes);
  const std::string path = PathOf(sha);
  std::error_code ec;
  if (fs::exists(path, ec)) return sha;
  fs::path folder = fs::path(path).parent_path();
  fs::create_directories(folder, ec);
  if (ec) return BadInput(folder.string(), "cannot create the snapshot folder: " + ec.message(), "check that the study folder is writable");
  std::string tmp = (folder / (".tmp-" + sha.substr(0, 16) + "-XXXXXX")).string();
  int fd = mkstemp(tmp.data());
  if (fd < 0) return BadInput(folder.string(), std::string("cannot write a snapshot: ") + std::strerror(errno), "check that the study folder is writable");
  size_t done = 0;
  while (done < bytes.size()) {
    ssize_t n = ::write(fd, bytes.data() + done, bytes.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) {
      std::string why = std::strerror(errno);
      ::close(fd);
      ::unlink(tmp.c_str());
      return BadInput(tmp, "cannot write a snapshot: " + why, "check free disk space");
    }
    done += static_cast<size_t>(n);
  }
  // fsync before rename: after a crash the name points at whole content or nothing.
  bool ok = ::fchmod(fd, 0444) == 0;  // evidence: read-only once stored
  ok = ::fsync(fd) == 0 && ok;
  ok = ::close(fd) == 0 && ok;
  if (!ok || ::rename(tmp.c_str(), path.c_str()) != 0) {
    std::string why = std::strerror(errno);
    ::unlink(tmp.c_str());
    return BadInput(path, "cannot store a snapshot: " + why, "check free disk space and permissions");
  }
  return sha;
}

Result<std::string> SnapshotStore::Get(const std::string& sha) const {
  const std::string path = PathOf(sha);
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "the snapshot is missing", "restore the study's snapshots/ folder from its backup");
  std::stringstream ss;
  ss << in.rdbuf();
  std::string bytes = ss.str();
  if (Sha256Hex(bytes) != sha)
    return BadInput(path, "the snapshot was changed after it was stored (its SHA-256 no longer matches its name)",
                    "restore the original file from a backup");
  return bytes;
}

}  // namespace twinprobe
