#include "desk/sessions.h"

#include <algorithm>

#include "core/sha256.h"

namespace twinprobe {

std::string SessionTable::Start(const std::string& member, int64_t now) {
  std::string id = RandomHex(32);
  std::lock_guard<std::mutex> lock(mu_);
  sessions_[id] = DeskSession{member, RandomHex(32), now, now};
  return id;
}

std::optional<DeskSession> SessionTable::Find(const std::string& id, int64_t now) {
  std::lock_guard<std::mutex> lock(mu_);
  auto it = sessions_.find(id);
  if (it == sessions_.end()) return std::nullopt;
  DeskSession& s = it->second;
  if (now - s.last_seen > kIdleSeconds || now - s.started > kLifetimeSeconds) {
    sessions_.erase(it);
    return std::nullopt;
  }
  s.last_seen = now;
  return s;
}

void SessionTable::End(const std::string& id) {
  std::lock_guard<std::mutex> lock(mu_);
  sessions_.erase(id);
}

int64_t SignInThrottle::WaitSeconds(const std::string& member, int64_t now) {
  std::lock_guard<std::mutex> lock(mu_);
  auto it = entries_.find(member);
  if (it == entries_.end()) return 0;
  return std::max<int64_t>(0, it->second.blocked_until - now);
}

void SignInThrottle::Failed(const std::string& member, int64_t now) {
  std::lock_guard<std::mutex> lock(mu_);
  Entry& e = entries_[member];
  e.failures = std::min(e.failures + 1, 30);
  const int64_t wait = std::min<int64_t>(kMaxWaitSeconds, int64_t{1} << std::min(e.failures - 1, 20));
  e.blocked_until = now + wait;
}

void SignInThrottle::Succeeded(const std::string& member) {
  std::lock_guard<std::mutex> lock(mu_);
  entries_.erase(member);
}

}  // namespace twinprobe
