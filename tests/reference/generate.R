# Writes r_cases.tsv (the inputs) and r_fixtures.tsv (R's answers) for
# tests/stats/reference_test.cpp. Run from this folder:
#   Rscript generate.R
# Seeded, so a re-run on the same R version rewrites identical files.
# Written with R 4.2.2 (Debian 12 r-base-core).
source("reference.R")
set.seed(20270301)
cases <- character(0)
add <- function(kind, ...) cases <<- c(cases, paste0(kind, "\t", paste0(...)))
csv <- function(...) paste(c(...), collapse = ",")
confs <- c(0.95, 0.95, 0.9, 0.99)
rsize <- function() sample(c(1:40, 60, 100, 250, 1000, 5000, 1e5, 1e6, 1e7), 1)

# Published examples (sources named in tests/stats/*_test.cpp).
add("binom", csv(682, 925, 0.75, 0, 0.95))        # Conover (1971), R's binom.test help
add("mcnemar", csv(794, 150, 86, 570, 0.95))      # Agresti (1990/2002) approval ratings
add("newcombe", csv(794, 150, 86, 570, 0.95))
add("newcombe", csv(40, 30, 10, 0, 0.95))         # net discrimination example (a, b, c of 40, 30, 10)
add("newcombe", csv(14, 5, 0, 22, 0.95))          # Altman et al. (2000) Table 6.2 layout
add("fisher", csv(3, 1, 1, 3, 2, 0.95))           # tea tasting, greater
add("fisher", csv(3, 1, 1, 3, 0, 0.95))
add("fisher", csv(2, 15, 10, 3, 1, 0.95))         # Fisher's convictions, less
add("fisher", csv(2, 15, 10, 3, 0, 0.95))
penicillin <- "0,6,0,5;3,3,0,6;6,0,2,4;5,1,6,0;2,0,5,0"  # R's mantelhaen.test help (Agresti 1990)
add("mh", penicillin, "|0,0.95")
add("mh_exact", penicillin, "|0,0.95")
add("mh_exact", penicillin, "|2,0.95")
bh15 <- c(0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344, 0.0459, 0.3240, 0.4262, 0.5719, 0.6528, 0.7590, 1.000)
for (m in c("bonferroni", "holm", "hochberg", "hommel", "bh", "by")) add("adjust", m, "|", csv(bh15))

# Seeded random cases, including zeros, ties and counts up to 1e7.
for (i in 1:160) {
  n <- rsize(); x <- sample(0:n, 1)
  p0 <- sample(c(0.5, 0.75, round(runif(1), 4), 0.01), 1)
  add("binom", csv(x, n, p0, sample(0:2, 1), sample(confs, 1)))
}
for (i in 1:20) {  # far tails: log10 of one-sided tails
  n <- sample(c(2000, 5000, 1e5, 1e7), 1); x <- sample(c(0, 1, n - 1, n, round(n / 10)), 1)
  add("binom_log10", csv(x, n, 0.5))
}
for (i in 1:60) { n <- rsize(); add("wilson", csv(sample(0:n, 1), n, sample(confs, 1))) }
rtab <- function(scale) { s <- sample(c(3, 10, 50, 400, 5000, scale), 1); sample(0:s, 4, replace = TRUE) }
for (i in 1:120) add("mcnemar", csv(rtab(1e6), sample(confs, 1)))
for (i in 1:60) add("newcombe", csv(rtab(1e5), sample(confs, 1)))
for (i in 1:120) {
  t <- rtab(3000)
  if (i %% 12 == 0) t <- sample(c(0:2, 2e5), 4, replace = TRUE)
  add("fisher", csv(t, sample(0:2, 1), sample(confs, 1)))
}
for (i in 1:20) add("fisher_log10", csv(sample(c(0, 1, 2, 500, 2000), 4, replace = TRUE)))
for (i in 1:50) {
  K <- sample(2:8, 1)
  tabs <- replicate(K, { repeat { t <- sample(0:sample(c(5, 30, 200, 2000), 1), 4, replace = TRUE); if (sum(t) >= 2) break }; t }, simplify = FALSE)
  add("mh", paste(vapply(tabs, csv, ""), collapse = ";"), "|0,", sample(confs, 1))
}
for (i in 1:40) {
  K <- sample(2:5, 1)
  tabs <- replicate(K, { repeat { t <- sample(0:sample(c(4, 12, 40), 1), 4, replace = TRUE); if (sum(t) >= 2) break }; t }, simplify = FALSE)
  add("mh_exact", paste(vapply(tabs, csv, ""), collapse = ";"), "|", sample(0:2, 1), ",", sample(confs, 1))
}
for (i in 1:12) {
  len <- sample(c(1:12, 50, 200), 1)
  p <- signif(c(runif(len) ^ sample(c(1, 3, 6), 1)), 6)
  if (len > 3) p[sample(len, 2)] <- p[1]  # ties
  for (m in c("bonferroni", "holm", "hochberg", "hommel", "bh", "by")) add("adjust", m, "|", csv(p))
}
writeLines(cases, "r_cases.tsv")
out <- character(0)
for (line in cases) {
  f <- strsplit(line, "\t", fixed = TRUE)[[1]]
  out <- c(out, paste(c(f[1], f[2], compute(f[1], f[2])), collapse = "\t"))
}
writeLines(c(paste0("# R ", R.version$major, ".", R.version$minor, "; written by tests/reference/generate.R"), out),
           "r_fixtures.tsv")
