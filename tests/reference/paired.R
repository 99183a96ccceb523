# Paired-design statistics written in R from their published formulas, as
# independent references for twinprobe's stats/ (tests source this file and
# compare live). Notation: a both positive, b reference arm only, c other arm
# only, d neither.

# Mid-p interval for b successes in b + c trials (Lancaster 1961; Berry &
# Armitage 1995), solved with uniroot on the mid-p binomial tails, mapped to
# the conditional odds ratio p / (1 - p).
midp_binom_ci <- function(x, n, conf = 0.95, alternative = "two.sided") {
  alpha <- if (alternative == "two.sided") (1 - conf) / 2 else 1 - conf
  upper_tail <- function(p) pbinom(x, n, p, lower.tail = FALSE) + dbinom(x, n, p) / 2 - alpha
  lower_tail <- function(p) pbinom(x - 1, n, p) + dbinom(x, n, p) / 2 - alpha
  lo <- if (x == 0) 0 else uniroot(upper_tail, c(1e-300, 1 - 1e-16), tol = 1e-15, maxiter = 10000)$root
  hi <- if (x == n) 1 else uniroot(lower_tail, c(1e-300, 1 - 1e-16), tol = 1e-15, maxiter = 10000)$root
  if (alternative == "less") lo <- 0
  if (alternative == "greater") hi <- 1
  c(lo, hi)
}
midp_or_ci <- function(b, c, conf = 0.95, alternative = "two.sided") {
  p <- midp_binom_ci(b, b + c, conf, alternative)
  p / (1 - p)
}

# Bonett & Price (2006), Stat Med 25:3039-3047: hybrid Wilson score interval
# for (a + b) / (a + c).
bonett_price_ratio <- function(a, b, c, conf = 0.95, alternative = "two.sided") {
  ns <- a + b + c; n1 <- a + b; n2 <- a + c
  z <- qnorm(if (alternative == "two.sided") 1 - (1 - conf) / 2 else conf)
  A <- sqrt((b + c + 2) / ((n1 + 1) * (n2 + 1)))
  B <- sqrt((1 - (n1 + 1) / (ns + 2)) / (n1 + 1))
  C <- sqrt((1 - (n2 + 1) / (ns + 2)) / (n2 + 1))
  zz <- z * A / (B + C)
  wil <- function(x) (2 * x + zz^2 + c(-1, 1) * zz * sqrt(zz^2 + 4 * x * (1 - x / ns))) / (2 * (ns + zz^2))
  w1 <- wil(n1); w2 <- wil(n2)
  lo <- w1[1] / w2[2]; hi <- if (w2[1] <= 0) Inf else w1[2] / w2[1]
  if (alternative == "less") lo <- 0
  if (alternative == "greater") hi <- Inf
  c(lo, hi)
}

# Tango (1998), Stat Med 17:891-908: score statistic for delta = p1 - p2.
tango_score <- function(b, c, n, delta0) {
  B <- -b - c + (2 * n - b + c) * delta0
  C <- -c * delta0 * (1 - delta0)
  q <- (sqrt(B^2 - 8 * n * C) - B) / (4 * n)
  (b - c - n * delta0) / sqrt(n * (2 * q + delta0 * (1 - delta0)))
}
tango_ci <- function(b, c, n, conf = 0.95) {
  z <- qnorm(1 - (1 - conf) / 2)
  f <- function(target) function(d) tango_score(b, c, n, d) - target
  lo <- if (b - c == -n) -1 else uniroot(f(z), c(-1 + 1e-12, 1 - 1e-12), tol = 1e-15, maxiter = 10000)$root
  hi <- if (b - c == n) 1 else uniroot(f(-z), c(-1 + 1e-12, 1 - 1e-12), tol = 1e-15, maxiter = 10000)$root
  c(lo, hi)
}
# Two one-sided score tests against the margins (Liu et al. 2002, Stat Med
# 21:231-245): p-values of the lower and upper test and the TOST p.
tost_score <- function(b, c, n, lower, upper) {
  pl <- pnorm(tango_score(b, c, n, lower), lower.tail = FALSE)
  pu <- pnorm(tango_score(b, c, n, upper))
  c(pl, pu, max(pl, pu))
}
