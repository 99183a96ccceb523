#!/usr/bin/python3
"""scipy side of bench/ranks: the same measures on the same data as ranks_bench.

Usage: reference.py DATA_DIR [--resamples N] [--perm-gap-listings K] [--perm-emd-listings K]
Reads DATA_DIR/ranks.csv (written by ranks_bench) and prints one JSON line per
measure, like ranks_bench: {"measure", "seconds" (CPU), "count", "check"}.
Permutation tests are slow in Python, so they run on the first K listings
and the driver scales the time to all listings (it says so in its table).
"""
import json
import math
import sys
import time

import numpy as np
from scipy import stats

args = sys.argv[1:]
data_dir = args[0]
resamples = 10000
k_gap, k_emd = 200, 10
for i, a in enumerate(args):
    if a == "--resamples":
        resamples = int(args[i + 1])
    if a == "--perm-gap-listings":
        k_gap = int(args[i + 1])
    if a == "--perm-emd-listings":
        k_emd = int(args[i + 1])


def report(measure, seconds, count, check):
    print(json.dumps({"measure": measure, "seconds": seconds, "count": count, "check": check}), flush=True)


listings = {}
order = []
with open(data_dir + "/ranks.csv") as fh:
    next(fh)
    for line in fh:
        listing, _q, _l, pos, _item, _gender, origin = line.rstrip("\n").split(",")
        if listing not in listings:
            listings[listing] = ([], [])
            order.append(listing)
        if origin == "inland":
            listings[listing][0].append(float(pos))
        elif origin == "coastal":
            listings[listing][1].append(float(pos))
pairs = [(np.array(listings[k][0]), np.array(listings[k][1])) for k in order]

t = time.process_time()
check = sum(stats.wasserstein_distance(a, b) for a, b in pairs)
report("emd", time.process_time() - t, len(pairs), check)

# scipy's own rules differ from R's (method='auto' is exact only up to 8 per
# group); method='exact' is the same computation as R's exact test here.
t = time.process_time()
check = sum(stats.mannwhitneyu(a, b, alternative="two-sided", method="exact").pvalue for a, b in pairs)
report("mann_whitney", time.process_time() - t, len(pairs), check)

t = time.process_time()
gaps = []
for a, b in pairs:
    gaps.append(np.mean(1 / np.log2(1 + a)) - np.mean(1 / np.log2(1 + b)))
w = stats.wilcoxon(gaps, correction=True, mode="approx")
s = stats.binomtest(int(np.sum(np.array(gaps) > 0)), int(np.sum(np.array(gaps) != 0)), 0.5)
report("signed_rank", time.process_time() - t, len(gaps), float(w.pvalue) + float(s.pvalue))


def gap_stat(x, y, axis):
    return np.mean(1 / np.log2(1 + x), axis=axis) - np.mean(1 / np.log2(1 + y), axis=axis)


rng = np.random.default_rng(1)
t = time.process_time()
check = 0.0
for a, b in pairs[:k_gap]:
    r = stats.permutation_test((a, b), gap_stat, vectorized=True, n_resamples=resamples, alternative="two-sided",
                               random_state=rng)
    check += r.pvalue
report("perm_gap", time.process_time() - t, min(k_gap, len(pairs)), check)

t = time.process_time()
check = 0.0
for a, b in pairs[:k_emd]:
    r = stats.permutation_test((a, b), lambda x, y: stats.wasserstein_distance(x, y), vectorized=False,
                               n_resamples=resamples, alternative="greater", random_state=rng)
    check += r.pvalue
report("perm_emd", time.process_time() - t, min(k_emd, len(pairs)), check)

with open("/proc/self/status") as fh:
    for line in fh:
        if line.startswith("VmHWM:"):
            report("peak_rss_mb", 0, 0, int(line.split()[1]) / 1024.0)
