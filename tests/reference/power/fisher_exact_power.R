#!/usr/bin/env Rscript
# Exact power of R's two-sided fisher.test for two arms of n each, by brute
# force over every pair of outcomes (base R only): the reference for
# stats/power_fisher.h, run live by tests/stats/power_fisher_test.cpp.
#   Rscript fisher_exact_power.R n p1 p2 alpha   -> power
a <- as.numeric(commandArgs(trailingOnly = TRUE))
n <- a[1]; p1 <- a[2]; p2 <- a[3]; alpha <- a[4]
power <- 0
for (x1 in 0:n) for (x2 in 0:n) {
  p <- fisher.test(matrix(c(x1, x2, n - x1, n - x2), 2))$p.value
  if (p <= alpha) power <- power + dbinom(x1, n, p1) * dbinom(x2, n, p2)
}
cat(sprintf("%.17g\n", power))
