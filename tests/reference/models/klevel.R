# Reference values for stats/cochran_q.h, stats/trend.h, stats/k_by_two.h and
# stats/pairwise.h, run live by tests/stats/klevel_test.cpp.
#   Rscript klevel.R IN.tsv OUT.txt KIND [ARG]
# KIND sets:   IN.tsv is one row per vacancy, one 0/1 column per level.
#              Cochran's Q from its definition (Cochran 1950, Biometrika
#              37:256-266); with ARG "exact" also the permutation p by listing
#              every arrangement within each set (small tables only); the
#              pairwise exact McNemar p = binom.test(b, b + c) and p.adjust.
# KIND groups: IN.tsv has columns x (positives), n (probes), score; ARG is
#              the p.adjust method. prop.trend.test, chisq.test(correct =
#              FALSE), fisher.test on the k x 2 table, pairwise fisher.test.
args <- commandArgs(trailingOnly = TRUE)
d <- read.delim(args[1])
out <- file(args[2], "w")
put <- function(key, v) writeLines(paste(key, paste(formatC(v, digits = 17, format = "g"), collapse = " ")), out)
kind <- args[3]
# twinprobe spells the methods in lower case (bh, by); p.adjust wants BH, BY.
method <- function(a) switch(a, bh = "BH", by = "BY", a)
if (kind == "sets") {
  m <- as.matrix(d)
  k <- ncol(m); C <- colSums(m); R <- rowSums(m); N <- sum(m)
  q <- (k - 1) * (k * sum(C^2) - N^2) / (k * N - sum(R^2))
  put("q", q)
  put("p", pchisq(q, k - 1, lower.tail = FALSE))
  if (length(args) > 3 && args[4] == "exact") {
    # Every arrangement of each informative set's positives over the k
    # probes, each equally likely: list them all (small tables only).
    inf <- m[R > 0 & R < k, , drop = FALSE]
    pats <- lapply(rowSums(inf), function(r) {
      cm <- combn(k, r)
      lapply(seq_len(ncol(cm)), function(c) { v <- rep(0, k); v[cm[, c]] <- 1; v })
    })
    grid <- as.matrix(expand.grid(lapply(pats, seq_along)))
    base <- colSums(m[R == k, , drop = FALSE])
    ss <- apply(grid, 1, function(g) {
      tot <- base
      for (i in seq_along(g)) tot <- tot + pats[[i]][[g[i]]]
      sum(tot^2)
    })
    put("p_exact", mean(ss >= sum(C^2)))
  }
  pairs <- c()
  for (i in 1:(k - 1)) for (j in (i + 1):k) {
    b <- sum(m[, i] == 1 & m[, j] == 0); cc <- sum(m[, i] == 0 & m[, j] == 1)
    pairs <- c(pairs, if (b + cc == 0) 1 else binom.test(b, b + cc)$p.value)
  }
  put("pair_p", pairs)
  put("pair_adjusted", p.adjust(pairs, if (length(args) > 3 && args[4] != "exact") method(args[4]) else "holm"))
} else {
  tr <- suppressWarnings(prop.trend.test(d$x, d$n, d$score))
  put("trend", tr$statistic)
  put("trend_p", tr$p.value)
  tab <- cbind(d$x, d$n - d$x)
  ch <- suppressWarnings(chisq.test(tab, correct = FALSE))
  put("chi2", ch$statistic)
  put("chi2_p", ch$p.value)
  put("fisher_p", fisher.test(tab, workspace = 2e8)$p.value)
  pairs <- c()
  k <- nrow(d)
  for (i in 1:(k - 1)) for (j in (i + 1):k) pairs <- c(pairs, fisher.test(tab[c(i, j), ])$p.value)
  put("pair_p", pairs)
  put("pair_adjusted", p.adjust(pairs, method(args[4])))
}
close(out)
