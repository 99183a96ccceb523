#!/usr/bin/env Rscript
# Generates spending_boundaries.csv: two-sided Lan–DeMets spending boundaries
# (z scale) from rpact's getDesignGroupSequential (Debian package
# r-cran-rpact 3.3.4; typeOfDesign "asOF" = O'Brien–Fleming type, "asP" =
# Pocock type; sided = 2). The reference for stats/sequential_normal.h.
# Needs: apt-get install r-cran-rpact (not needed to run the tests, which
# read the committed CSV). Run from this folder:
#   Rscript spending_boundaries.R > spending_boundaries.csv
suppressMessages(library(rpact))
designs <- list(
  list(alpha = 0.05, t = c(0.2, 0.4, 0.6, 0.8, 1)),
  list(alpha = 0.05, t = c(0.5, 1)),
  list(alpha = 0.05, t = c(0.3, 0.7, 1)),
  list(alpha = 0.01, t = c(0.25, 0.5, 0.75, 1)))
cat("design,spending,alpha,look,information,boundary,alpha_spent\n")
for (i in seq_along(designs)) {
  d <- designs[[i]]
  for (sp in c("asOF", "asP")) {
    g <- getDesignGroupSequential(kMax = length(d$t), alpha = d$alpha, sided = 2,
                                  typeOfDesign = sp, informationRates = d$t)
    for (k in seq_along(d$t))
      cat(sprintf("%d,%s,%.2f,%d,%.2f,%.10f,%.12g\n", i, if (sp == "asOF") "obf" else "pocock",
                  d$alpha, k, d$t[k], g$criticalValues[k], g$alphaSpent[k]))
  }
}
