#include "core/locked_file.h"

#include <fcntl.h>
#include <sys/file.h>
#include <unistd.h>

namespace twinprobe {

LockedFile& LockedFile::operator=(LockedFile&& other) noexcept {
  if (this != &other) {
    Close();
    fd_ = other.fd_;
    other.fd_ = -1;
  }
  return *this;
}

LockedFile LockedFile::Open(const std::string& path) {
  LockedFile file;
  file.fd_ = open(path.c_str(), O_RDWR | O_CREAT | O_NOFOLLOW | O_CLOEXEC, 0644);
  return file;
}

bool LockedFile::TryLock() { return fd_ >= 0 && flock(fd_, LOCK_EX | LOCK_NB) == 0; }

std::string LockedFile::Read() const {
  char buf[256];
  const ssize_t n = fd_ >= 0 ? pread(fd_, buf, sizeof buf - 1, 0) : -1;
  return n > 0 ? std::string(buf, static_cast<size_t>(n)) : std::string();
}

bool LockedFile::Write(std::string_view text) {
  return fd_ >= 0 && ftruncate(fd_, 0) == 0 &&
         pwrite(fd_, text.data(), text.size(), 0) == static_cast<ssize_t>(text.size());
}

void LockedFile::Close() {
  if (fd_ >= 0) close(fd_);
  fd_ = -1;
}

}  // namespace twinprobe
