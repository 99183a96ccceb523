# Reference values from R's stats package for twinprobe's stats/ module.
#
# Usage: Rscript reference.R CASES.tsv OUT.tsv
# Each line of CASES.tsv is "kind<TAB>arguments" (arguments comma-separated;
# strata separated by ';'). OUT.tsv repeats kind and arguments and adds
# key=value fields with 17 significant digits. tests/stats/reference_test.cpp
# reads the output (the fixtures in this folder, and a live run on fresh
# random tables). Used by generate.R for the stored fixtures.
#
# Keys ending in _r are R's own uniroot results (about 4 digits; compared
# within R's tolerance). Keys ending in _tight solve the same equations in R
# with uniroot(tol = 1e-15) on the log odds-ratio scale: an independent
# full-precision computation.
alt_name <- function(code) c("two.sided", "less", "greater")[as.integer(code) + 1]
num <- function(s) as.numeric(strsplit(s, ",", fixed = TRUE)[[1]])
fmt <- function(v) {
  out <- trimws(formatC(v, digits = 17, format = "g"))
  out[is.nan(v)] <- "NaN"; out[is.na(v) & !is.nan(v)] <- "NaN"
  out[is.infinite(v) & v > 0] <- "Inf"; out[is.infinite(v) & v < 0] <- "-Inf"
  out
}
kv <- function(...) { x <- list(...); paste0(names(x), "=", vapply(x, function(v) paste(fmt(v), collapse = ","), "")) }

# Solve f(t) = 0 in t = log(psi), tightly.
tight_root <- function(f) {
  r <- uniroot(f, c(-5, 5), tol = 1e-15, maxiter = 100000, extendInt = "yes")
  exp(r$root)
}
# The conditional family from log null weights logdc on support.
cond_tight <- function(logdc, support, x, alt, conf) {
  lo <- min(support); hi <- max(support)
  dn <- function(t) { d <- logdc + t * support; d <- exp(d - max(d)); d / sum(d) }
  mle <- if (x == lo) 0 else if (x == hi) Inf else tight_root(function(t) sum(support * dn(t)) - x)
  up <- function(alpha) if (x == hi) Inf else tight_root(function(t) log(sum(dn(t)[support <= x])) - log(alpha))
  low <- function(alpha) if (x == lo) 0 else tight_root(function(t) log(sum(dn(t)[support >= x])) - log(alpha))
  ci <- switch(alt, less = c(0, up(1 - conf)), greater = c(low(1 - conf), Inf),
               two.sided = c(low((1 - conf) / 2), up((1 - conf) / 2)))
  c(mle, ci)
}
logsumexp <- function(v) { m <- max(v); if (!is.finite(m)) return(m); m + log(sum(exp(v - m))) }

compute <- function(kind, args) {
  if (kind == "binom") {
    a <- num(args); alt <- alt_name(a[4])
    r <- binom.test(a[1], a[2], p = a[3], alternative = alt, conf.level = a[5])
    return(kv(p = r$p.value, ci = r$conf.int[1:2]))
  }
  # Far tails in log space. pbinom(log.p = TRUE) loses up to five digits of
  # the log beyond 1e-600 (checked against exact big-integer sums), so the
  # tails are summed from dbinom's / dhyper's accurate log densities instead.
  if (kind == "binom_log10") {
    a <- num(args)
    return(kv(less = logsumexp(dbinom(0:a[1], a[2], a[3], log = TRUE)) / log(10),
              greater = logsumexp(dbinom(a[1]:a[2], a[2], a[3], log = TRUE)) / log(10)))
  }
  if (kind == "wilson") {
    a <- num(args)
    r <- prop.test(a[1], a[2], conf.level = a[3], correct = FALSE)
    return(kv(ci = r$conf.int[1:2]))
  }
  if (kind == "mcnemar") {
    a <- num(args); b <- a[2]; c <- a[3]; n <- b + c; k <- min(b, c)
    m <- matrix(c(a[1], c, b, a[4]), 2)  # rows: reference +/-, cols: other +/-
    exact <- if (n == 0) 1 else binom.test(b, n)$p.value
    mid <- if (n == 0) 1 else if (b == c) 1 - 0.5 * dbinom(b, n, 0.5) else
      2 * (pbinom(k - 1, n, 0.5) + 0.5 * dbinom(k, n, 0.5))
    u <- suppressWarnings(mcnemar.test(m, correct = FALSE))
    cc <- suppressWarnings(mcnemar.test(m, correct = TRUE))
    ci <- if (n == 0) c(NaN, NaN) else { p <- binom.test(b, n, conf.level = a[5])$conf.int; p / (1 - p) }
    log10_exact <- if (n == 0 || b == c) 0 else min(0, log(2) + logsumexp(dbinom(0:k, n, 0.5, log = TRUE))) / log(10)
    return(kv(exact = exact, mid = mid, chi2 = unname(u$statistic), chi2_p = u$p.value,
              chi2_cc = unname(cc$statistic), chi2_cc_p = cc$p.value, or_ci = ci, log10_exact = log10_exact))
  }
  if (kind == "newcombe") {
    # Newcombe (1998) method 10, written out independently in R.
    a <- num(args); conf <- a[5]; A <- a[1]; B <- a[2]; C <- a[3]; D <- a[4]; n <- A + B + C + D
    w <- function(x) prop.test(x, n, conf.level = conf, correct = FALSE)$conf.int
    p1 <- (A + B) / n; p2 <- (A + C) / n; w1 <- w(A + B); w2 <- w(A + C)
    if (A + B == 0) w1 <- c(0, w1[2]); if (A + C == 0) w2 <- c(0, w2[2])
    den <- (A + B) * (C + D) * (A + C) * (B + D)
    num0 <- A * D - B * C
    phi <- if (den == 0) 0 else (if (num0 > 0) max(num0 - n / 2, 0) else num0) / sqrt(den)
    dl1 <- p1 - w1[1]; du1 <- w1[2] - p1; dl2 <- p2 - w2[1]; du2 <- w2[2] - p2
    d <- p1 - p2
    return(kv(d = d, ci = c(d - sqrt(dl1^2 - 2 * phi * dl1 * du2 + du2^2), d + sqrt(dl2^2 - 2 * phi * dl2 * du1 + du1^2))))
  }
  if (kind == "fisher") {
    a <- num(args); alt <- alt_name(a[5]); conf <- a[6]
    m <- matrix(c(a[1], a[3], a[2], a[4]), 2)
    r <- fisher.test(m, alternative = alt, conf.level = conf)
    M <- a[1] + a[3]; N <- a[2] + a[4]; K <- a[1] + a[2]
    support <- max(0, K - N):min(K, M)
    tight <- if (length(support) > 1) cond_tight(dhyper(support, M, N, K, log = TRUE), support, a[1], alt, conf) else c(NaN, 0, Inf)
    return(kv(p = r$p.value, estimate_r = unname(r$estimate), ci_r = r$conf.int[1:2],
              estimate_tight = tight[1], ci_tight = tight[2:3]))
  }
  if (kind == "fisher_log10") {
    a <- num(args); M <- a[1] + a[3]; N <- a[2] + a[4]; K <- a[1] + a[2]
    lo <- max(0, K - N); hi <- min(K, M)
    return(kv(less = logsumexp(dhyper(lo:a[1], M, N, K, log = TRUE)) / log(10),
              greater = logsumexp(dhyper(a[1]:hi, M, N, K, log = TRUE)) / log(10)))
  }
  if (kind %in% c("mh", "mh_exact")) {
    parts <- strsplit(args, "|", fixed = TRUE)[[1]]
    tabs <- lapply(strsplit(parts[1], ";", fixed = TRUE)[[1]], num)
    opts <- num(parts[2]); alt <- alt_name(opts[1]); conf <- opts[2]
    x <- array(unlist(lapply(tabs, function(t) c(t[1], t[3], t[2], t[4]))), c(2, 2, length(tabs)))
    if (kind == "mh") {
      u <- mantelhaen.test(x, correct = FALSE, conf.level = conf)
      cc <- mantelhaen.test(x, correct = TRUE, conf.level = conf)
      return(kv(estimate = unname(u$estimate), ci = u$conf.int[1:2], chi2 = unname(u$statistic), p = u$p.value,
                chi2_cc = unname(cc$statistic), p_cc = cc$p.value))
    }
    r <- mantelhaen.test(x, exact = TRUE, alternative = alt, conf.level = conf)
    m <- apply(x, c(2L, 3L), sum)[1L, ]; n <- apply(x, c(2L, 3L), sum)[2L, ]; t <- apply(x, c(1L, 3L), sum)[1L, ]
    s <- sum(x[1L, 1L, ]); lo <- sum(pmax(0, t - n)); hi <- sum(pmin(m, t))
    dc <- .Call(stats:::C_d2x2xk, dim(x)[3L], m, n, t, hi - lo + 1L)
    tight <- cond_tight(log(dc), lo:hi, s, alt, conf)
    return(kv(p = r$p.value, estimate_r = unname(r$estimate), ci_r = r$conf.int[1:2],
              estimate_tight = tight[1], ci_tight = tight[2:3]))
  }
  if (kind == "adjust") {
    parts <- strsplit(args, "|", fixed = TRUE)[[1]]
    method <- c(bonferroni = "bonferroni", holm = "holm", hochberg = "hochberg", hommel = "hommel",
                bh = "BH", by = "BY")[[parts[1]]]
    return(kv(adjusted = p.adjust(num(parts[2]), method)))
  }
  stop("unknown kind ", kind)
}

args <- commandArgs(trailingOnly = TRUE)
if (length(args) == 2) {
  cases <- readLines(args[1])
  out <- character(0)
  for (line in cases) {
    f <- strsplit(line, "\t", fixed = TRUE)[[1]]
    out <- c(out, paste(c(f[1], f[2], compute(f[1], f[2])), collapse = "\t"))
  }
  writeLines(out, args[2])
}
