# Reference values for analysis/covariate_model.h, run live by
# tests/analysis/covariate_model_test.cpp and tests/cli/import_covariates_test.cpp.
#   Rscript covariate_glm.R IN.tsv OUT.txt CONF REFERENCE
# IN.tsv: one row per application: group, y (1 positive, 0 not), then one
# column per covariate under its own name. A covariate whose every value is a
# number is numeric; any other is a factor with its levels in byte order
# (sort(method = "radix"), the C locale's order, whatever R's locale), the
# first being the baseline; group is a factor with REFERENCE first, then the
# other groups in order of first appearance (the importer's order).
# The model: glm(y ~ group + covariates, family = binomial) fitted until the
# deviance repeats exactly (epsilon = 1e-30; glm's default 1e-8 leaves about
# 1e-6 in the coefficients). Profile limits of the group terms: uniroot(tol =
# 1e-12) on MASS's signed root sign(b - bhat) sqrt(D(b) - D(bhat)), beside
# MASS's own confint() (a spline through the profile, about 1e-4).
# Writes "key v1 v2 ..." lines, 17 significant digits, coefficients in
# model.matrix order (intercept, groups, then covariates as given).
suppressMessages(library(MASS))
args <- commandArgs(trailingOnly = TRUE)
d <- read.delim(args[1], colClasses = "character")
conf <- as.numeric(args[3])
ref <- args[4]
# The importer's order: the reference, then the others as they first appear.
d$group <- factor(d$group, levels = c(ref, setdiff(unique(d$group), ref)))
d$y <- as.integer(d$y)
covs <- setdiff(names(d), c("group", "y"))
for (v in covs) {
  num <- suppressWarnings(as.numeric(d[[v]]))
  if (all(!is.na(num))) d[[v]] <- num
  else d[[v]] <- factor(d[[v]], levels = sort(unique(d[[v]]), method = "radix"))
}
form <- as.formula(paste("y ~", paste(c("group", covs), collapse = " + ")))
ctl <- glm.control(epsilon = 1e-30, maxit = 100)
fit <- glm(form, family = binomial, data = d, control = ctl)
out <- file(args[2], "w")
put <- function(key, v) writeLines(paste(key, paste(formatC(v, digits = 17, format = "g"), collapse = " ")), out)
sm <- summary(fit)$coefficients
put("coef", coef(fit))
put("se", sm[, 2])
put("z", sm[, 3])
put("p", sm[, 4])
put("deviance", deviance(fit))
put("null_deviance", fit$null.deviance)
put("df", c(fit$df.residual, fit$df.null))
wald <- confint.default(fit, level = conf)
put("wald_low", wald[, 1])
put("wald_high", wald[, 2])
reduced <- update(fit, as.formula(paste("y ~", if (length(covs)) paste(covs, collapse = " + ") else "1")))
a <- anova(reduced, fit, test = "LRT")
put("lr", c(a$Deviance[2], a$Df[2], a[["Pr(>Chi)"]][2]))
X <- model.matrix(fit)
cut <- sqrt(qchisq(conf, 1))
prof <- function(j, b) {
  g <- glm(d$y ~ X[, -j, drop = FALSE] - 1, offset = X[, j] * b, family = binomial, control = ctl)
  sign(b - coef(fit)[j]) * sqrt(max(0, deviance(g) - deviance(fit)))
}
gj <- grep("^group", colnames(X))
lo <- hi <- numeric(length(gj))
for (i in seq_along(gj)) {
  j <- gj[i]; b <- coef(fit)[j]; se <- sm[j, 2]
  lo[i] <- uniroot(function(x) prof(j, x) + cut, c(b - 40 * se, b), tol = 1e-12)$root
  hi[i] <- uniroot(function(x) prof(j, x) - cut, c(b, b + 40 * se), tol = 1e-12)$root
}
put("profile_low", lo)
put("profile_high", hi)
mass <- suppressMessages(confint(fit, parm = gj, level = conf))
put("confint_low_r", mass[, 1])
put("confint_high_r", mass[, 2])
close(out)
