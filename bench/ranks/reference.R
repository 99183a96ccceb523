# R side of bench/ranks: R's wilcox.test on the same data as ranks_bench.
# Usage: Rscript reference.R DATA_DIR
# Prints one JSON line per measure: {"measure", "seconds" (CPU), "count", "check"}.
args <- commandArgs(trailingOnly = TRUE)
d <- read.csv(file.path(args[1], "ranks.csv"), stringsAsFactors = FALSE)
report <- function(measure, seconds, count, check)
  cat(sprintf('{"measure": "%s", "seconds": %.6f, "count": %d, "check": %.17g}\n', measure, seconds, count, check))
cpu <- function() { p <- proc.time(); p[["user.self"]] + p[["sys.self"]] }  # CPU seconds
by_listing <- split(d, factor(d$listing, levels = unique(d$listing)))
pairs <- lapply(by_listing, function(l) list(a = l$position[l$origin == "inland"], b = l$position[l$origin == "coastal"]))

t <- cpu()
check <- sum(vapply(pairs, function(p) wilcox.test(p$a, p$b)$p.value, 0))
report("mann_whitney", cpu() - t, length(pairs), check)

t <- cpu()
gaps <- vapply(pairs, function(p) mean(1 / log2(1 + p$a)) - mean(1 / log2(1 + p$b)), 0)
w <- wilcox.test(gaps)
s <- binom.test(sum(gaps > 0), sum(gaps != 0), 0.5)
report("signed_rank", cpu() - t, length(gaps), w$p.value + s$p.value)

status <- readLines("/proc/self/status")
hwm <- as.numeric(strsplit(trimws(sub("VmHWM:", "", grep("^VmHWM:", status, value = TRUE))), " ")[[1]][1])
report("peak_rss_mb", 0, 0, hwm / 1024)
