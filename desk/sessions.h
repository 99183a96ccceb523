#pragma once
// Signed-in members of the desk, kept in memory only (a restart signs
// everyone out), and the brake on guessing passphrases.
//
// A session is a 256-bit random id in an HttpOnly, SameSite=Strict cookie,
// with its own random CSRF token that every form carries. It ends after
// kIdleSeconds without a request or kLifetimeSeconds after sign-in, whichever
// comes first. Thread-safe.
#include <cstdint>
#include <map>
#include <mutex>
#include <optional>
#include <string>

namespace twinprobe {

struct DeskSession {
  std::string member;
  std::string csrf;                    // hex, 64 characters
  int64_t started = 0, last_seen = 0;  // epoch seconds
};

class SessionTable {
 public:
  static constexpr int64_t kIdleSeconds = 30 * 60;
  static constexpr int64_t kLifetimeSeconds = 12 * 3600;

  // Starts a session for `member`; returns its id.
  std::string Start(const std::string& member, int64_t now);
  // The live session with this id (and marks it seen), or nullopt when the id
  // is unknown or the session expired (an expired one is forgotten).
  std::optional<DeskSession> Find(const std::string& id, int64_t now);
  void End(const std::string& id);

 private:
  std::mutex mu_;
  std::map<std::string, DeskSession> sessions_;
};

// Slows down guessing: after the k-th failed sign-in of a member in a row,
// the next attempt for that member is refused for 2^(k-1) seconds (1, 2, 4 …,
// at most 15 minutes), without checking the passphrase. A success resets the
// count. Counted per member, not per address: everyone comes from 127.0.0.1.
class SignInThrottle {
 public:
  static constexpr int64_t kMaxWaitSeconds = 15 * 60;

  // Seconds the member must still wait (0: may try now).
  int64_t WaitSeconds(const std::string& member, int64_t now);
  void Failed(const std::string& member, int64_t now);
  void Succeeded(const std::string& member);

 private:
  struct Entry {
    int failures = 0;
    int64_t blocked_until = 0;
  };
  std::mutex mu_;
  std::map<std::string, Entry> entries_;
};

}  // namespace twinprobe
