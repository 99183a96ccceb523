# The work of `twinprobe analyze` on a pairs file, in base R, for the import
# benchmark (bench/import/run): read the CSV, pair the two probes of each
# vacancy, exact McNemar test on the discordant pairs (binom.test), and the
# Cochran-Mantel-Haenszel test over the values of each stratum column
# (mantelhaen.test on the arm x outcome table of each value, pairing ignored,
# as docs/methods.md describes). Prints one "key value" line per number, in
# the same order and with the same keys as bench/import/compare.py reads from
# `twinprobe analyze --json`.
#
# Usage: Rscript bench/import/analyze_reference.R pairs.csv REFERENCE_ARM
args <- commandArgs(trailingOnly = TRUE)
d <- read.csv(args[1], colClasses = "character")
reference <- args[2]
d$positive <- d$outcome == "1"
ref <- d[d$arm == reference, ]
oth <- d[d$arm != reference, ]
oth <- oth[match(ref$vacancy, oth$vacancy), ]
r <- ref$positive
o <- oth$positive
out <- function(key, value) cat(key, format(value, digits = 17), "\n")
out("paired.a", sum(r & o))
out("paired.b", sum(r & !o))
out("paired.c", sum(!r & o))
out("paired.d", sum(!r & !o))
b <- sum(r & !o)
c <- sum(!r & o)
out("mcnemar_exact_p", binom.test(b, b + c)$p.value)
for (column in c("occupation", "region")) {
  values <- sort(unique(d[[column]]))
  tables <- array(0, dim = c(2, 2, length(values)))
  for (k in seq_along(values)) {
    in_value <- ref[[column]] == values[k]
    rk <- r[in_value]
    ok <- o[in_value]
    # rows: reference, other arm; columns: positive, negative
    tables[, , k] <- matrix(c(sum(rk), sum(ok), sum(!rk), sum(!ok)), 2)
  }
  mh <- mantelhaen.test(tables)
  out(paste0(column, ".mh_estimate"), unname(mh$estimate))
  out(paste0(column, ".cmh_statistic_corrected"), unname(mh$statistic))
  out(paste0(column, ".cmh_p_corrected"), mh$p.value)
}
