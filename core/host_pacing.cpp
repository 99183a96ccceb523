#include "core/host_pacing.h"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <thread>

namespace twinprobe {
namespace {

double WallSeconds() {
  return std::chrono::duration<double>(std::chrono::system_clock::now().time_since_epoch()).count();
}

// "127.0.0.1:8080" -> "127.0.0.1_8080": one plain file name per authority
// (letters, digits, '.', '-' kept; anything else, ':' and '/' included, '_').
std::string FileNameOf(const std::string& authority) {
  std::string out;
  for (char c : authority) {
    const bool plain = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '.' || c == '-';
    out += plain ? c : '_';
  }
  return out.empty() || out[0] == '.' ? "_" + out : out;
}

}  // namespace

void HostTurn::Finish() {
  char text[64];
  const int n = std::snprintf(text, sizeof text, "%.6f\n", WallSeconds());
  if (n > 0) file_.Write(std::string_view(text, static_cast<size_t>(n)));
  file_.Close();
}

HostTurn HostPacing::Take(const std::string& authority, double interval_seconds,
                          const std::function<bool()>& cancelled) {
  HostTurn turn;
  if (dir_.empty()) return turn;
  std::error_code ec;
  std::filesystem::create_directories(dir_, ec);
  turn.file_ = LockedFile::Open(dir_ + "/" + FileNameOf(authority));
  if (!turn.file_.is_open()) return turn;
  while (!turn.file_.TryLock()) {
    if (cancelled && cancelled()) return HostTurn();
    std::this_thread::sleep_for(std::chrono::milliseconds(50));
  }
  const std::string text = turn.file_.Read();
  const double last_end = text.empty() ? 0 : std::strtod(text.c_str(), nullptr);
  // A clock set back (an end time in the future) waits no longer than one
  // interval.
  const double until = std::min(last_end + interval_seconds, WallSeconds() + interval_seconds);
  while (WallSeconds() < until) {
    if (cancelled && cancelled()) return HostTurn();
    std::this_thread::sleep_for(std::chrono::duration<double>(std::min(0.05, until - WallSeconds())));
  }
  return turn;
}

}  // namespace twinprobe
