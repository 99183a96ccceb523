#pragma once
// The peak memory of a piece of work, for the bounded-cost tests of issue 23:
// the work runs in a forked child and the child's peak resident set comes back
// through wait4's rusage. The child inherits the test binary's pages, which
// count too, so bounds are stated well above the binary's own size.
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <functional>

namespace twinprobe::testing {

// Peak resident set of a child running `work` (kilobytes), or -1 if the
// child failed (work returned false, or it crashed).
inline long PeakKbInChild(const std::function<bool()>& work) {
  pid_t pid = fork();
  if (pid == 0) _exit(work() ? 0 : 1);
  int status = 0;
  struct rusage usage {};
  if (wait4(pid, &status, 0, &usage) != pid || !WIFEXITED(status) || WEXITSTATUS(status) != 0) return -1;
  return usage.ru_maxrss;
}

}  // namespace twinprobe::testing
