#pragma once
// A small file that coordinates processes through flock(2): an import lock
// (core/import_lock.h), a host's turn (core/host_pacing.h). The lock lives as
// long as the descriptor: closing it, or the process ending however it ends,
// lets go, so no stale lock is ever left behind.
#include <string>
#include <string_view>

namespace twinprobe {

class LockedFile {
 public:
  LockedFile() = default;
  LockedFile(LockedFile&& other) noexcept : fd_(other.fd_) { other.fd_ = -1; }
  LockedFile& operator=(LockedFile&& other) noexcept;
  LockedFile(const LockedFile&) = delete;
  LockedFile& operator=(const LockedFile&) = delete;
  ~LockedFile() { Close(); }

  // Opens (creating) `path` without following a symbolic link; a closed
  // LockedFile on failure, with errno set.
  static LockedFile Open(const std::string& path);

  bool is_open() const { return fd_ >= 0; }
  // Takes the exclusive lock if nobody holds it; never waits.
  bool TryLock();
  // The file's text (its first 255 bytes).
  std::string Read() const;
  // Replaces the file's text; false when it cannot be written.
  bool Write(std::string_view text);
  // Closes the file and so lets go of the lock.
  void Close();

 private:
  int fd_ = -1;
};

}  // namespace twinprobe
