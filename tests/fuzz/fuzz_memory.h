#pragma once
// The memory bound of one fuzz input (issue 23): hostile HTML once cost 3.2 GB
// for a 100 KB mail. A target holds an InputMemoryBound for the length of an
// input; when the process's peak resident set rose during the input, the new
// peak must lie less than `bound_mb` above the resident set at the input's
// start, else the input is a finding. (When the peak did not rise, the input
// cost no more than an earlier one, which was checked then.) The bound
// includes ASan's shadow and quarantine, which scripts/fuzz builds with.
#include <sys/resource.h>
#include <unistd.h>

#include <cstdio>

#include "tests/fuzz/fuzz_check.h"

namespace twinprobe::fuzz {

// The resident set now, in kilobytes (/proc/self/statm, second field).
inline long CurrentRssKb() {
  long pages_total = 0, pages_resident = 0;
  FILE* f = std::fopen("/proc/self/statm", "r");
  if (!f) return 0;
  if (std::fscanf(f, "%ld %ld", &pages_total, &pages_resident) != 2) pages_resident = 0;
  std::fclose(f);
  return pages_resident * (sysconf(_SC_PAGESIZE) / 1024);
}

// The peak resident set of the process so far, in kilobytes.
inline long PeakRssKb() {
  struct rusage usage {};
  getrusage(RUSAGE_SELF, &usage);
  return usage.ru_maxrss;
}

class InputMemoryBound {
 public:
  explicit InputMemoryBound(long bound_mb)
      : bound_kb_(bound_mb * 1024), start_kb_(CurrentRssKb()), peak_before_kb_(PeakRssKb()) {}
  InputMemoryBound(const InputMemoryBound&) = delete;
  InputMemoryBound& operator=(const InputMemoryBound&) = delete;
  ~InputMemoryBound() {
    const long peak_kb = PeakRssKb();
    if (peak_kb > peak_before_kb_) FUZZ_CHECK(peak_kb - start_kb_ < bound_kb_);
  }

 private:
  long bound_kb_, start_kb_, peak_before_kb_;
};

}  // namespace twinprobe::fuzz
