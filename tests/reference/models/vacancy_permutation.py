"""Reference values for analysis/vacancy_test.h, run live by
tests/analysis/vacancy_test_test.cpp with Debian's python3, written from the
test's definition alone (no code shared with the C++):
    /usr/bin/python3 vacancy_permutation.py IN.tsv OUT.txt RESAMPLES
IN.tsv: one vacancy a row, "block level positive" (no header). The levels
are re-assigned to the vacancies within each block, keeping each block's
count of vacancies per level; T = sum_j S_j^2 / n_j (S_j the positive count
of level j's vacancies, n_j their number). Writes
    statistic T
    p_exact p           with RESAMPLES = 0: every distinct assignment
                        (itertools over each block's multiset permutations),
                        p = #{T* >= T} / #assignments
    p_resampled p se    otherwise: RESAMPLES uniform re-assignments from
                        random.Random(20270412), p = (1 + #{T* >= T}) / (1 +
                        RESAMPLES) and its Monte Carlo standard error
"""
import itertools
import math
import random
import sys
from collections import defaultdict

rows = [line.split() for line in open(sys.argv[1]) if line.strip()]
resamples = int(sys.argv[3])
blocks = defaultdict(list)  # block -> [(level, positive)]
for block, level, positive in rows:
    blocks[block].append((level, int(positive)))
levels = sorted({level for rows_ in blocks.values() for level, _ in rows_})
n = {l: sum(1 for rows_ in blocks.values() for level, _ in rows_ if level == l) for l in levels}


def statistic(assignment):
    sums = defaultdict(int)
    for block, labels in assignment.items():
        for label, (_, positive) in zip(labels, blocks[block]):
            sums[label] += positive
    return sum(sums[l] ** 2 / n[l] for l in levels)


observed = statistic({b: [level for level, _ in r] for b, r in blocks.items()})
tolerance = 1e-12 * abs(observed)
with open(sys.argv[2], "w") as out:
    out.write("statistic %r\n" % observed)
    if resamples == 0:
        per_block = [sorted(set(itertools.permutations([level for level, _ in blocks[b]]))) for b in blocks]
        names = list(blocks)
        total = extreme = 0
        for combo in itertools.product(*per_block):
            total += 1
            if statistic(dict(zip(names, combo))) >= observed - tolerance:
                extreme += 1
        out.write("p_exact %r\n" % (extreme / total))
    else:
        rng = random.Random(20270412)
        extreme = 0
        for _ in range(resamples):
            assignment = {}
            for b, r in blocks.items():
                labels = [level for level, _ in r]
                rng.shuffle(labels)
                assignment[b] = labels
            if statistic(assignment) >= observed - tolerance:
                extreme += 1
        p = (1 + extreme) / (1 + resamples)
        out.write("p_resampled %r %r\n" % (p, math.sqrt(p * (1 - p) / resamples)))
