#!/usr/bin/env Rscript
# Generates power_prop_test.csv: R's power.prop.test (stats package) on a grid
# of two-proportion designs, the reference for stats/power_unpaired.h.
# Run from this folder:  Rscript power_prop_test.R > power_prop_test.csv
# n and p2 are solved with uniroot at tol = 1e-12 (R's default tolerance,
# .Machine$double.eps^0.25, would only give about 4 decimals); column
# n_default holds R's answer at its default tolerance for comparison.
cases <- expand.grid(p1 = c(0.10, 0.25, 0.50), p2 = c(0.07, 0.20, 0.65),
                     sig = c(0.05, 0.01), sides = c(1, 2), strict = c(FALSE, TRUE))
cases <- cases[cases$p1 != cases$p2, ]
alt <- function(s) if (s == 1) "one.sided" else "two.sided"
cat("p1,p2,sig_level,sides,strict,n,power_at_n,target_power,n_solved,n_default,p2_solved\n")
for (i in seq_len(nrow(cases))) {
  x <- cases[i, ]
  n <- 250
  pw <- power.prop.test(n = n, p1 = x$p1, p2 = x$p2, sig.level = x$sig,
                        alternative = alt(x$sides), strict = x$strict)$power
  nn <- power.prop.test(p1 = x$p1, p2 = x$p2, sig.level = x$sig, power = 0.8,
                        alternative = alt(x$sides), strict = x$strict, tol = 1e-12)$n
  nd <- power.prop.test(p1 = x$p1, p2 = x$p2, sig.level = x$sig, power = 0.8,
                        alternative = alt(x$sides), strict = x$strict)$n
  p2s <- power.prop.test(n = n, p1 = x$p1, sig.level = x$sig, power = 0.8,
                         alternative = alt(x$sides), strict = x$strict, tol = 1e-12)$p2
  cat(sprintf("%.2f,%.2f,%.2f,%d,%s,%d,%.15g,%.2f,%.15g,%.15g,%.15g\n", x$p1, x$p2, x$sig, x$sides,
              tolower(as.character(x$strict)), n, pw, 0.8, nn, nd, p2s))
}
