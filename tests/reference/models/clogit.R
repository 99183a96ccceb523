# Reference values for stats/clogit.h, run live by tests/stats/clogit_test.cpp.
#   Rscript clogit.R IN.tsv OUT.txt DROP [CONF]
# IN.tsv: columns set, y, then one column per covariate. DROP: comma-separated
# 1-based covariate columns left out of a nested model ("0" for none), whose
# log likelihood is written as loglik_reduced. Lines "key v1 v2 ...".
# coxph's default eps (1e-9) leaves about 1e-7 in the coefficients, so the fit
# is run to eps = 1e-14.
suppressMessages(library(survival))
args <- commandArgs(trailingOnly = TRUE)
d <- read.delim(args[1])
X <- as.matrix(d[, -(1:2), drop = FALSE])
ctl <- coxph.control(eps = 1e-14, iter.max = 100)
fit <- clogit(d$y ~ X + strata(d$set), method = "exact", control = ctl)
out <- file(args[2], "w")
put <- function(key, v) writeLines(paste(key, paste(formatC(v, digits = 17, format = "g"), collapse = " ")), out)
put("coef", coef(fit))
put("se", sqrt(diag(vcov(fit))))
put("loglik", fit$loglik)
put("lr", 2 * diff(fit$loglik))
# summary() rounds the Wald statistic to two decimals; fit$wald.test is the
# unrounded value it prints.
put("wald", fit$wald.test)
put("wald_p", pchisq(fit$wald.test, length(coef(fit)), lower.tail = FALSE))
put("lr_p", summary(fit)$logtest[["pvalue"]])
drop <- as.integer(strsplit(args[3], ",")[[1]])
if (!identical(drop, 0L)) {
  R <- X[, -drop, drop = FALSE]
  red <- clogit(d$y ~ R + strata(d$set), method = "exact", control = ctl)
  put("loglik_reduced", red$loglik[2])
}
# CONF: also the likelihood-ratio (profile) limits of every coefficient,
# where 2 (loglik - loglik with that coefficient fixed as an offset) equals
# qchisq(CONF, 1), solved with uniroot(tol = 1e-12).
if (length(args) > 3) {
  cut <- sqrt(qchisq(as.numeric(args[4]), 1))
  prof <- function(j, b) {
    off <- X[, j] * b
    R <- X[, -j, drop = FALSE]
    g <- if (ncol(R) > 0) clogit(d$y ~ R + offset(off) + strata(d$set), method = "exact", control = ctl)
         else clogit(d$y ~ offset(off) + strata(d$set), method = "exact", control = ctl)
    sign(b - coef(fit)[j]) * sqrt(max(0, 2 * (fit$loglik[2] - g$loglik[length(g$loglik)])))
  }
  lo <- hi <- numeric(ncol(X))
  se <- sqrt(diag(vcov(fit)))
  for (j in seq_len(ncol(X))) {
    b <- coef(fit)[j]
    lo[j] <- uniroot(function(x) prof(j, x) + cut, c(b - 10 * se[j], b), tol = 1e-12)$root
    hi[j] <- uniroot(function(x) prof(j, x) - cut, c(b, b + 10 * se[j]), tol = 1e-12)$root
  }
  put("profile_low", lo)
  put("profile_high", hi)
}
close(out)
