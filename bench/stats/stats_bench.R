# The R side of bench/stats/run: the same computation as stats_bench.cpp with
# R's stats package, timed, then compared with twinprobe's numbers.
# Usage: Rscript stats_bench.R DATA RESULTS_FROM_TWINPROBE
args <- commandArgs(trailingOnly = TRUE)
x <- read.delim(args[1])
compute <- function(x) {
  K <- nrow(x)
  mcnemar_p <- or_low <- or_high <- fisher_p <- fisher_est <- fisher_low <- fisher_high <- numeric(K)
  arm <- array(0, c(2, 2, K))
  for (i in seq_len(K)) {
    a <- x$a[i]; b <- x$b[i]; c <- x$c[i]; d <- x$d[i]
    bt <- binom.test(b, b + c)
    mcnemar_p[i] <- bt$p.value
    ci <- bt$conf.int / (1 - bt$conf.int)
    or_low[i] <- ci[1]; or_high[i] <- ci[2]
    m <- matrix(c(a + b, a + c, c + d, b + d), 2)  # rows reference / other, cols positive / negative
    ft <- fisher.test(m)
    fisher_p[i] <- ft$p.value; fisher_est[i] <- ft$estimate
    fisher_low[i] <- ft$conf.int[1]; fisher_high[i] <- ft$conf.int[2]
    arm[, , i] <- m
  }
  mh <- mantelhaen.test(arm, correct = TRUE)
  list(mcnemar_p = mcnemar_p, or_low = or_low, or_high = or_high, fisher_p = fisher_p, fisher_est = fisher_est,
       fisher_low = fisher_low, fisher_high = fisher_high,
       holm_mcnemar = p.adjust(mcnemar_p, "holm"), bh_mcnemar = p.adjust(mcnemar_p, "BH"),
       holm_fisher = p.adjust(fisher_p, "holm"), bh_fisher = p.adjust(fisher_p, "BH"),
       mh = c(unname(mh$estimate), mh$conf.int[1:2], unname(mh$statistic), mh$p.value))
}
best <- Inf
for (rep in 1:3) {
  t <- system.time(r <- compute(x))[["elapsed"]]
  best <- min(best, t)
}
ours <- read.delim(args[2], comment.char = "#")
mh_line <- grep("^# mh", readLines(args[2]), value = TRUE)
ours_mh <- as.numeric(strsplit(mh_line, "\t")[[1]][-1])
rel <- function(a, b) max(ifelse(a == b, 0, abs(a - b) / pmax(abs(a), abs(b))))
exact_cols <- c("mcnemar_p", "or_low", "or_high", "fisher_p", "holm_mcnemar", "bh_mcnemar", "holm_fisher", "bh_fisher")
max_exact <- max(sapply(exact_cols, function(k) rel(r[[k]], ours[[k]])), rel(r$mh, ours_mh))
# R's conditional MLE and interval come from uniroot (tolerance 1.22e-4 on psi or 1/psi).
on_r_scale <- function(v) ifelse(v <= 1, v, 1 / v)
max_uniroot <- max(sapply(c("fisher_est", "fisher_low", "fisher_high"),
                          function(k) max(abs(on_r_scale(r[[k]]) - on_r_scale(ours[[k]])))))
cat(sprintf("r_seconds=%.6f\nvalues_1e9=%d\nmax_rel_error=%.3g\nuniroot_values=%d\nmax_uniroot_scale_diff=%.3g\n", best,
            length(exact_cols) * nrow(x) + length(r$mh), max_exact, 3 * nrow(x), max_uniroot))
