// Benchmark of the exact paired power (stats/power_paired.h), run by
// bench/power/run side by side with the same enumeration in vectorised R
// (tests/reference/power/mcnemar_exact_power.R).
// Prints one line per workload: NAME SECONDS_PER_CALL VALUE.
#include <chrono>
#include <cstdio>
#include <functional>
#include <vector>

#include "stats/power_paired.h"

namespace {

using Clock = std::chrono::steady_clock;

// Seconds per call: the best of 5 batches, each repeated until it lasts at
// least 0.2 s (the machine is shared, so the best batch is the fairest).
double Time(const std::function<double()>& fn, double& value) {
  double best = 1e300;
  for (int batch = 0; batch < 5; ++batch) {
    int64_t reps = 0;
    auto start = Clock::now();
    double elapsed = 0;
    do {
      value = fn();
      ++reps;
      elapsed = std::chrono::duration<double>(Clock::now() - start).count();
    } while (elapsed < 0.2);
    best = std::min(best, elapsed / static_cast<double>(reps));
  }
  return best;
}

}  // namespace

int main() {
  using namespace twinprobe::stats;
  struct Work {
    const char* name;
    std::function<double()> fn;
  };
  const std::vector<Work> work = {
      {"power_N10000_p10_0.05_p01_0.02", [] { return McNemarExactPower(10000, {0.05, 0.02}, 0.05); }},
      {"power_N10000_p10_0.05_p01_0.04", [] { return McNemarExactPower(10000, {0.05, 0.04}, 0.05); }},
      {"search_80pct_p10_0.05_p01_0.02",
       [] { return static_cast<double>(McNemarExactSampleSize({0.05, 0.02}, 0.05, 0.80).n_stable); }},
  };
  for (const auto& w : work) {
    double value = 0;
    double seconds = Time(w.fn, value);
    std::printf("%s %.9f %.15g\n", w.name, seconds, value);
  }
  return 0;
}
