#!/usr/bin/env Rscript
# Exact power of the two-sided exact conditional McNemar test, written as a
# plain vectorised R enumeration (base R only): an implementation independent
# of stats/power_paired.cpp, used live by tests/stats/power_paired_test.cpp
# and side by side by bench/power/run.
#   power(N) = sum_{nd=0}^{N} dbinom(nd, N, psi) * g(nd)
#   g(nd)    = P(b <= k) + P(b >= nd - k),  b ~ Binomial(nd, p10 / psi),
# with k the largest count at which binom.test-style 2 * pbinom(k, nd, 1/2)
# <= alpha (the exact McNemar p-value min(1, 2 P(X <= min(b, c)))).
#
# Usage:
#   Rscript mcnemar_exact_power.R power  N p10 p01 alpha      -> power
#   Rscript mcnemar_exact_power.R search p10 p01 alpha target nmax
#        -> first N with power >= target, first N from which power stays >= target up to nmax
reject_k <- function(nd, alpha) {
  k <- qbinom(alpha / 2, nd, 0.5)
  k - (pmin(1, 2 * pbinom(k, nd, 0.5)) > alpha)
}
cond_power <- function(nd, alpha, pi) {
  k <- reject_k(nd, alpha)
  ifelse(k < 0, 0, pbinom(k, nd, pi) + pbinom(nd - k - 1, nd, pi, lower.tail = FALSE))
}
exact_power <- function(N, p10, p01, alpha) {
  psi <- p10 + p01
  nd <- 0:N
  sum(dbinom(nd, N, psi) * cond_power(nd, alpha, p10 / psi))
}
power_curve <- function(nmax, p10, p01, alpha) {
  psi <- p10 + p01
  g <- cond_power(0:nmax, alpha, p10 / psi)
  vapply(seq_len(nmax), function(N) sum(dbinom(0:N, N, psi) * g[1:(N + 1)]), 0)
}
search_n <- function(p10, p01, alpha, target, nmax) {
  pw <- power_curve(nmax, p10, p01, alpha)
  first <- which(pw >= target)[1]
  below <- which(pw < target)
  stable <- if (length(below) == 0) 1 else max(below) + 1
  c(first, stable)
}
if (!interactive() && sys.nframe() == 0) {
  a <- commandArgs(trailingOnly = TRUE)
  if (length(a) >= 1 && a[1] == "power") {
    cat(sprintf("%.17g\n", exact_power(as.numeric(a[2]), as.numeric(a[3]), as.numeric(a[4]), as.numeric(a[5]))))
  } else if (length(a) >= 1 && a[1] == "search") {
    cat(search_n(as.numeric(a[2]), as.numeric(a[3]), as.numeric(a[4]), as.numeric(a[5]), as.numeric(a[6])), "\n")
  }
}
