#pragma once
// Who writes, when the writer is a desk member rather than the shell user.
// The desk serves several members from one process, one request per thread,
// so $TWINPROBE_ACTOR (process-wide) cannot say who is acting; a
// DeskActorScope names the member for the writes of the current thread, and
// CurrentActor() (core/audit.h) prefers it. Every entry made through the desk
// therefore carries the member in entered_by and in the audit row, exactly as
// a command run with TWINPROBE_ACTOR=member would.
#include <string>

namespace twinprobe {

class DeskActorScope {
 public:
  explicit DeskActorScope(std::string member);
  ~DeskActorScope();  // restores the previous actor of this thread
  DeskActorScope(const DeskActorScope&) = delete;
  DeskActorScope& operator=(const DeskActorScope&) = delete;

 private:
  std::string previous_;
};

// The member acting on this thread, or "" outside any DeskActorScope.
const std::string& DeskActor();

}  // namespace twinprobe
