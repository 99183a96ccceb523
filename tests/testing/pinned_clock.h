#pragma once
// Pins the study clock (TWINPROBE_NOW, core/clock.h) for the tests in this
// process and the commands they start, and unpins it at the end of scope.
// Fieldwork in the example study's 2027 season needs a clock inside it: the
// plausible-time rules refuse times in the future (collector/time_rules.h).
#include <cstdlib>
#include <string>

namespace twinprobe::testing {

class PinnedClock {
 public:
  explicit PinnedClock(const std::string& now = "2027-04-26T14:59:00Z") { setenv("TWINPROBE_NOW", now.c_str(), 1); }
  ~PinnedClock() { unsetenv("TWINPROBE_NOW"); }
  PinnedClock(const PinnedClock&) = delete;
  PinnedClock& operator=(const PinnedClock&) = delete;
};

}  // namespace twinprobe::testing
