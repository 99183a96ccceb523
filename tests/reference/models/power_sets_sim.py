"""Power of a sets design by simulating the analysis, for `power sets`
(stats/power_sets.h), run live by tests/cli/power_sets_simulation_test.cpp
with Debian's python3 (numpy, scipy), written from the analysis's
definitions alone (no code shared with the C++):
    /usr/bin/python3 power_sets_sim.py IN.tsv OUT.txt
IN.tsv: one row "vacancies replicates seed r1 r2 ... rk". Each simulated
study draws every vacancy's k outcomes independently with the rates
(numpy.random.Generator(PCG64(seed))) and analyses it as `analyze` does:
  overall   Cochran's Q (Cochran 1950, Biometrika 37:256-266),
            Q = (k-1) (k sum C_j^2 - N^2) / (k N - sum R_i^2), against
            chi-square on k - 1 df (scipy.stats.chi2.sf) at alpha 0.05;
  pair_*    the pair of arms with the smallest nonzero gap |r_i - r_j|, by
            the exact McNemar test (two-sided: min(1, 2 P(Bin(b + c, 1/2)
            <= min(b, c))), scipy.stats.binom.cdf) among all k (k-1)/2
            pairs: pair_bonferroni at alpha / m; pair_holm with Holm's
            (1979) step-down adjustment of the m p-values, adjusted p < alpha.
Writes "KEY_i power standard_error" for row i, the standard error
sqrt(power (1 - power) / replicates).
"""
import itertools
import sys

import numpy as np
from scipy.stats import binom, chi2

ALPHA = 0.05
with open(sys.argv[2], "w") as out:
    for row_index, line in enumerate(l for l in open(sys.argv[1]) if l.strip()):
        words = line.split()
        vacancies, replicates, seed = int(words[0]), int(words[1]), int(words[2])
        rates = np.array([float(w) for w in words[3:]])
        k = len(rates)
        pairs = list(itertools.combinations(range(k), 2))
        gaps = [abs(rates[i] - rates[j]) for i, j in pairs]
        smallest = min((g, n) for n, g in enumerate(gaps) if g > 0)[1]
        rng = np.random.Generator(np.random.PCG64(seed))
        y = (rng.random((replicates, vacancies, k)) < rates).astype(np.int8)
        # Cochran's Q per study.
        col = y.sum(axis=1, dtype=np.int64)               # (replicates, k)
        rowsum = y.sum(axis=2, dtype=np.int64)            # (replicates, vacancies)
        total = col.sum(axis=1)
        denom = k * total - (rowsum ** 2).sum(axis=1)
        q = np.where(denom > 0, (k - 1) * (k * (col ** 2).sum(axis=1) - total ** 2) / np.maximum(denom, 1), 0.0)
        p_q = np.where(denom > 0, chi2.sf(q, k - 1), 1.0)
        overall = float(np.mean(p_q < ALPHA))
        # Exact McNemar p of every pair.
        p_pairs = []
        for i, j in pairs:
            b = ((y[:, :, i] == 1) & (y[:, :, j] == 0)).sum(axis=1)
            c = ((y[:, :, i] == 0) & (y[:, :, j] == 1)).sum(axis=1)
            n = b + c
            p = np.where(n > 0, np.minimum(1.0, 2 * binom.cdf(np.minimum(b, c), np.maximum(n, 1), 0.5)), 1.0)
            p_pairs.append(p)
        p_pairs = np.array(p_pairs).T     # (replicates, m)
        m = len(pairs)
        bonferroni = float(np.mean(p_pairs[:, smallest] < ALPHA / m))
        # Holm: sort, multiply the r-th smallest by (m - r), running maximum, cap at 1.
        order = np.argsort(p_pairs, axis=1, kind="stable")
        sorted_p = np.take_along_axis(p_pairs, order, axis=1)
        adjusted_sorted = np.minimum(1.0, np.maximum.accumulate(sorted_p * (m - np.arange(m)), axis=1))
        adjusted = np.empty_like(adjusted_sorted)
        np.put_along_axis(adjusted, order, adjusted_sorted, axis=1)
        holm = float(np.mean(adjusted[:, smallest] < ALPHA))
        for key, power in (("overall", overall), ("pair_bonferroni", bonferroni), ("pair_holm", holm)):
            out.write("%s_%d %r %r\n" % (key, row_index, power, (power * (1 - power) / replicates) ** 0.5))
