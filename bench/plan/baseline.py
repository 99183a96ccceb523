#!/usr/bin/env python3
"""A minimal planner in Python's standard library, for context only.

There is no reference planner for correspondence tests in Debian's
packages, so bench/plan/run sets twinprobe's planning time beside this
straightforward permuted-block randomiser doing the same kind of work on
the same workload: 100,000 vacancies, 4 arms per set, 6 strata, 4
templates; per block a shuffled balanced list of (template offset, send
order row) cells, a Latin rotation of templates over arms, names rotated
per arm while avoiding reuse at an employer, and send times with gaps of
24-72 hours. It does not restrict times to sending hours or check its
work, so it does less than twinprobe. Prints: baseline seconds=S probes=N
"""
import random
import sys
import time


def plan(n):
    rng = random.Random(424242)
    arms, templates = 4, 4
    blocks = {}
    for i in range(n):
        blocks.setdefault((i % 2, (i // 2) % 3), []).append(i)
    design = [None] * n
    for key in sorted(blocks):
        members = blocks[key]
        cells = [(o, r) for o in range(templates) for r in range(arms)]
        full, rest = divmod(len(members), len(cells))
        seq = cells * full + rng.sample(cells, rest)
        rng.shuffle(seq)
        for v, cell in zip(members, seq):
            design[v] = cell
    names = [[f"Given{a}n{i}" for i in range(200)] for a in range(arms)]
    pointer = [0] * arms
    used = {}
    probes = []
    start = 1_803_888_000  # 2027-03-01T00:00Z
    for v in range(n):
        offset, row = design[v]
        employer = v // 4
        seen = used.setdefault(employer, set())
        t = start + (v // 200) * 86400 + 9 * 3600 + rng.randrange(8 * 3600)
        for pos in range(arms):
            arm = (row + pos) % arms
            while True:
                name = names[arm][pointer[arm] % 200]
                pointer[arm] += 1
                if name not in seen:
                    break
            seen.add(name)
            if pos:
                t += rng.randint(24 * 60, 72 * 60) * 60
            probes.append((v, arm, name, (offset + arm) % templates, pos + 1, t))
    return probes


def main():
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 100000
    best = float("inf")
    for _ in range(3):
        t0 = time.perf_counter()
        probes = plan(n)
        best = min(best, time.perf_counter() - t0)
    print(f"baseline seconds={best:.4f} probes={len(probes)}")


if __name__ == "__main__":
    main()
