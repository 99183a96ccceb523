# Reference values for stats/logistic.h, run live by tests/stats/logistic_test.cpp.
#   Rscript logistic.R IN.tsv OUT.txt CONF [DROP]
# IN.tsv: columns s (successes), m (trials), then one column per coefficient
# (the design matrix as given, intercept column included). Writes one line per
# quantity: "key v1 v2 ...", 17 significant digits.
# glm's default epsilon (1e-8) leaves about 1e-6 in the coefficients and
# standard errors, so every fit is run until the deviance repeats exactly; the profile limits are solved with uniroot(tol = 1e-12)
# on MASS's signed-root definition, beside MASS's own confint() (a spline
# through the profile, good to about 1e-4).
suppressMessages(library(MASS))
args <- commandArgs(trailingOnly = TRUE)
d <- read.delim(args[1])
conf <- as.numeric(args[3])
X <- as.matrix(d[, -(1:2), drop = FALSE])
ctl <- glm.control(epsilon = 1e-30, maxit = 100)
fit <- glm(cbind(d$s, d$m - d$s) ~ X - 1, family = binomial, control = ctl)
out <- file(args[2], "w")
put <- function(key, v) writeLines(paste(key, paste(formatC(v, digits = 17, format = "g"), collapse = " ")), out)
sm <- summary(fit)$coefficients
put("coef", coef(fit))
put("se", sm[, 2])
put("z", sm[, 3])
put("p", sm[, 4])
put("deviance", deviance(fit))
# The model is given as a design matrix (X - 1), so glm's own null deviance
# is that of mu = 1/2; with a column of ones the null model is the intercept.
if (any(apply(X, 2, function(col) all(col == 1)))) {
  null <- glm(cbind(d$s, d$m - d$s) ~ 1, family = binomial, control = ctl)
  put("null_deviance", deviance(null))
  put("df", c(fit$df.residual, null$df.residual))
} else {
  put("null_deviance", fit$null.deviance)
  put("df", c(fit$df.residual, fit$df.null))
}
put("loglik", as.numeric(logLik(fit)))
wald <- confint.default(fit, level = conf)
put("wald_low", wald[, 1])
put("wald_high", wald[, 2])
cut <- sqrt(qchisq(conf, 1))
prof <- function(j, b) {
  off <- X[, j] * b
  rest <- X[, -j, drop = FALSE]
  g <- if (ncol(rest) > 0) glm(cbind(d$s, d$m - d$s) ~ rest - 1, offset = off, family = binomial, control = ctl)
       else glm(cbind(d$s, d$m - d$s) ~ -1, offset = off, family = binomial, control = ctl)
  sign(b - coef(fit)[j]) * sqrt(max(0, deviance(g) - deviance(fit)))
}
lo <- hi <- numeric(ncol(X))
for (j in seq_len(ncol(X))) {
  b <- coef(fit)[j]; se <- sm[j, 2]
  lo[j] <- uniroot(function(x) prof(j, x) + cut, c(b - 40 * se, b), tol = 1e-12)$root
  hi[j] <- uniroot(function(x) prof(j, x) - cut, c(b, b + 40 * se), tol = 1e-12)$root
}
put("profile_low", lo)
put("profile_high", hi)
mass <- suppressMessages(confint(fit, level = conf))
put("confint_low_r", mass[, 1])
put("confint_high_r", mass[, 2])
# DROP: comma-separated 1-based columns left out of a nested model; its
# likelihood-ratio test against the full model, as anova(..., test = "LRT").
if (length(args) > 3) {
  drop <- as.integer(strsplit(args[4], ",")[[1]])
  R <- X[, -drop, drop = FALSE]
  red <- glm(cbind(d$s, d$m - d$s) ~ R - 1, family = binomial, control = ctl)
  a <- anova(red, fit, test = "LRT")
  put("lr", c(a$Deviance[2], a$Df[2], a[["Pr(>Chi)"]][2]))
}
close(out)
