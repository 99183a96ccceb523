# The R side of bench/power/run: the same workloads as power_bench.cpp with
# the vectorised R enumeration of tests/reference/power/mcnemar_exact_power.R.
# Prints NAME SECONDS_PER_CALL VALUE, timed like the C++ side (best of 5
# batches of at least 0.2 s).
args <- commandArgs(trailingOnly = TRUE)
source(file.path(args[1], "tests/reference/power/mcnemar_exact_power.R"))
time_it <- function(f) {
  best <- Inf
  for (batch in 1:5) {
    reps <- 0; start <- proc.time()[["elapsed"]]
    repeat {
      value <- f(); reps <- reps + 1
      elapsed <- proc.time()[["elapsed"]] - start
      if (elapsed >= 0.2) break
    }
    best <- min(best, elapsed / reps)
  }
  list(seconds = best, value = value)
}
work <- list(
  power_N10000_p10_0.05_p01_0.02 = function() exact_power(10000, 0.05, 0.02, 0.05),
  power_N10000_p10_0.05_p01_0.04 = function() exact_power(10000, 0.05, 0.04, 0.05),
  # Same search as McNemarExactSampleSize: every N up to the horizon 2 * 645.
  search_80pct_p10_0.05_p01_0.02 = function() search_n(0.05, 0.02, 0.05, 0.8, 1290)[2])
for (name in names(work)) {
  r <- time_it(work[[name]])
  cat(sprintf("%s %.9f %.15g\n", name, r$seconds, r$value))
}
