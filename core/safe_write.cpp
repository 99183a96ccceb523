#include "core/safe_write.h"

#include <fcntl.h>
#include <stdio.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <streambuf>
#include <vector>

namespace twinprobe {
namespace fs = std::filesystem;

// A stream buffer over a file descriptor: std::ofstream cannot be opened on
// a descriptor, and reopening the temporary by name would follow a link
// swapped in between.
class SafeFile::Buffer : public std::streambuf {
 public:
  explicit Buffer(int fd) : fd_(fd), buf_(1 << 16) { setp(buf_.data(), buf_.data() + buf_.size()); }
  bool failed() const { return failed_; }
  int sync() override { return Drain() ? 0 : -1; }

 protected:
  int_type overflow(int_type ch) override {
    if (!Drain()) return traits_type::eof();
    if (!traits_type::eq_int_type(ch, traits_type::eof())) {
      *pptr() = traits_type::to_char_type(ch);
      pbump(1);
    }
    return traits_type::not_eof(ch);
  }

 private:
  bool Drain() {
    const char* p = pbase();
    while (p < pptr()) {
      ssize_t n = ::write(fd_, p, static_cast<size_t>(pptr() - p));
      if (n < 0 && errno == EINTR) continue;
      if (n <= 0) {
        failed_ = true;
        break;
      }
      p += n;
    }
    setp(buf_.data(), buf_.data() + buf_.size());
    return !failed_;
  }
  int fd_;
  std::vector<char> buf_;
  bool failed_ = false;
};

namespace {

std::string TempTemplate(const std::string& target) { return target + ".tmp-XXXXXX"; }

Error WriteError(const std::string& target, const std::string& what) {
  return BadInput(target, what + " (" + std::strerror(errno) + ")", "check that the folder exists and is writable");
}

}  // namespace

SafeFile::SafeFile(std::string target, std::string temp, int fd)
    : target_(std::move(target)), temp_(std::move(temp)), fd_(fd), buffer_(std::make_unique<Buffer>(fd)),
      stream_(std::make_unique<std::ostream>(buffer_.get())) {}

Result<std::unique_ptr<SafeFile>> SafeFile::Create(const std::string& target) {
  std::string temp = TempTemplate(target);
  // mkostemp opens with O_CREAT|O_EXCL: an existing name, a link included,
  // is never opened; O_NOFOLLOW says the same for the reader of this code.
  int fd = ::mkostemp(temp.data(), O_CLOEXEC | O_NOFOLLOW);
  if (fd < 0) return WriteError(target, "cannot create the file");
  mode_t mask = ::umask(0);
  ::umask(mask);
  ::fchmod(fd, 0666 & ~mask);  // the mode a plain open would give, not mkstemp's 0600
  return std::unique_ptr<SafeFile>(new SafeFile(target, temp, fd));
}

SafeFile::~SafeFile() {
  stream_.reset();
  if (fd_ >= 0) ::close(fd_);
  if (!committed_) ::unlink(temp_.c_str());
}

Status SafeFile::Commit() {
  stream_->flush();
  bool ok = !buffer_->failed() && stream_->good();
  if (ok && ::fsync(fd_) != 0) ok = false;
  if (::close(fd_) != 0) ok = false;
  fd_ = -1;
  if (!ok) return WriteError(target_, "cannot write the file");
  if (::rename(temp_.c_str(), target_.c_str()) != 0) return WriteError(target_, "cannot put the file in place");
  committed_ = true;
  return {};
}

Status WriteFileSafely(const std::string& target, const std::string& content) {
  auto file = SafeFile::Create(target);
  if (!file.ok()) return file.error();
  file.value()->out() << content;
  return file.value()->Commit();
}

Result<std::unique_ptr<SafeFolder>> SafeFolder::Create(const std::string& target) {
  std::error_code ec;
  auto st = fs::symlink_status(target, ec);
  if (!ec && fs::is_symlink(st))
    return BadInput(target, "is a symbolic link; nothing is written through one", "remove the link or choose another folder");
  if (!ec && fs::exists(st) && !fs::is_directory(st))
    return BadInput(target, "exists and is not a folder", "remove it or choose another folder");
  std::string temp = TempTemplate(target);
  if (::mkdtemp(temp.data()) == nullptr) return WriteError(target, "cannot create the folder");
  ::chmod(temp.c_str(), 0777 & ~[] {
    mode_t m = ::umask(0);
    ::umask(m);
    return m;
  }());
  return std::unique_ptr<SafeFolder>(new SafeFolder(target, temp));
}

SafeFolder::~SafeFolder() {
  std::error_code ec;
  if (!committed_) fs::remove_all(temp_, ec);
}

Status SafeFolder::Commit() {
  std::error_code ec;
  if (!fs::exists(fs::symlink_status(target_, ec))) {
    if (::rename(temp_.c_str(), target_.c_str()) != 0) return WriteError(target_, "cannot put the folder in place");
    committed_ = true;
    return {};
  }
  // Swap the finished folder with the old one in one step, then remove the
  // old one (now at the temporary name): there is never a moment without a
  // whole folder at `target`.
  if (::renameat2(AT_FDCWD, temp_.c_str(), AT_FDCWD, target_.c_str(), RENAME_EXCHANGE) != 0)
    return WriteError(target_, "cannot put the folder in place");
  fs::remove_all(temp_, ec);  // the old folder
  committed_ = true;
  return {};
}

}  // namespace twinprobe
