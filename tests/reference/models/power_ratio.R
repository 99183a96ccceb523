# Reference values for unequal arms in stats/power_unpaired.h, run live by
# tests/stats/power_unpaired_ratio_test.cpp.
#   Rscript power_ratio.R IN.tsv OUT.txt
# IN.tsv: rows "n1 p1 p2 alpha sides strict ratio power" (header). For row i:
#   power_i   the pooled z test's power for n1 and n2 = ratio n1 (Fleiss,
#             Levin & Paik 2003, section 4.4, written out here independently)
#   n_i       the n1 reaching `power`, solved with uniroot(tol = 1e-13)
#   prop_i    R's power.prop.test(n = n1, ...)$power (only when ratio = 1)
args <- commandArgs(trailingOnly = TRUE)
d <- read.delim(args[1])
out <- file(args[2], "w")
put <- function(key, v) writeLines(paste(key, paste(formatC(v, digits = 17, format = "g"), collapse = " ")), out)
pw <- function(n1, p1, p2, alpha, sides, strict, r) {
  n2 <- r * n1
  pbar <- (n1 * p1 + n2 * p2) / (n1 + n2)
  se0 <- sqrt(pbar * (1 - pbar) * (1 / n1 + 1 / n2))
  se1 <- sqrt(p1 * (1 - p1) / n1 + p2 * (1 - p2) / n2)
  z <- qnorm(1 - alpha / sides)
  p <- pnorm((abs(p1 - p2) - z * se0) / se1)
  if (strict && sides == 2) p <- p + pnorm((abs(p1 - p2) + z * se0) / se1, lower.tail = FALSE)
  p
}
for (i in seq_len(nrow(d))) {
  x <- d[i, ]
  put(paste0("power_", i - 1), pw(x$n1, x$p1, x$p2, x$alpha, x$sides, x$strict == 1, x$ratio))
  n <- uniroot(function(n) pw(n, x$p1, x$p2, x$alpha, x$sides, x$strict == 1, x$ratio) - x$power,
               c(0.01, 1e7), tol = 1e-13)$root
  put(paste0("n_", i - 1), n)
  if (x$ratio == 1)
    put(paste0("prop_", i - 1), power.prop.test(n = x$n1, p1 = x$p1, p2 = x$p2, sig.level = x$alpha,
        alternative = if (x$sides == 1) "one.sided" else "two.sided", strict = x$strict == 1)$power)
}
close(out)
