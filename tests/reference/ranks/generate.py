#!/usr/bin/python3
"""Generates fixtures.json: reference values for twinprobe's rank statistics.

Reference libraries (Debian 12 packages): scipy 1.10 (python3-scipy) for
scipy.stats.wasserstein_distance, and R 4.2 (r-base-core) for
stats::wilcox.test (signed rank, paired and one-sample; rank sum), binom.test
(sign test), psignrank and pwilcox. The input data are drawn here from a
seeded generator (random.Random(20270301)) so the fixtures are reproducible;
they are test inputs, not demo data.

Run from anywhere:  tests/reference/ranks/generate.py
It needs /usr/bin/python3 with scipy and Rscript on PATH, and rewrites
fixtures.json next to this script. tests/stats/rank_reference_test.cpp reads it.
"""
import json
import os
import random
import subprocess
import sys
import tempfile

from scipy.stats import wasserstein_distance
import scipy

HERE = os.path.dirname(os.path.abspath(__file__))
rng = random.Random(20270301)


def g(x):
    return "%.17g" % x


def rvec(xs):
    return "c(" + ",".join(g(x) for x in xs) + ")"


def sample(n, decimals=None, lo=-5.0, hi=5.0):
    xs = [rng.uniform(lo, hi) for _ in range(n)]
    if decimals is not None:
        xs = [round(x, decimals) for x in xs]
    return xs


# ---- scipy: wasserstein_distance -------------------------------------------
emd_cases = []
# scipy's documented examples (scipy.stats.wasserstein_distance, Examples).
emd_cases.append(dict(u=[0, 1, 3], v=[5, 6, 8], uw=[], vw=[]))
emd_cases.append(dict(u=[0, 1], v=[0, 1], uw=[3, 1], vw=[2, 2]))
emd_cases.append(dict(u=[3.4, 3.9, 7.5, 7.8], v=[4.5, 1.4], uw=[1.4, 0.9, 3.1, 7.2], vw=[3.2, 3.5]))
for k in range(40):
    m, n = rng.randint(1, 60), rng.randint(1, 60)
    if k % 4 == 0:  # positions in a list of 50: many ties
        u = [rng.randint(1, 50) for _ in range(m)]
        v = [rng.randint(1, 50) for _ in range(n)]
    else:
        u = sample(m, 2 if k % 3 == 0 else None)
        v = sample(n, 2 if k % 3 == 0 else None, lo=-3, hi=8)
    uw = [rng.uniform(0, 3) for _ in u] if k % 2 == 1 else []
    vw = [rng.uniform(0, 3) for _ in v] if k % 2 == 1 else []
    if k % 8 == 1:
        uw[0] = 0.0  # a zero weight is allowed
    emd_cases.append(dict(u=u, v=v, uw=uw, vw=vw))
for c in emd_cases:
    c["distance"] = float(wasserstein_distance(c["u"], c["v"], c["uw"] or None, c["vw"] or None))

# ---- R: wilcox.test, binom.test, psignrank, pwilcox -------------------------
signed_cases = []
for k in range(36):
    n = [5, 8, 12, 15, 20, 30, 49, 50, 60, 120][k % 10]
    kind = k % 4
    if kind == 0:    # continuous: no ties, no zeros -> exact when n < 50
        x, y = sample(n), sample(n)
    elif kind == 1:  # rounded: ties in |d|
        x, y = sample(n, 0), sample(n, 0)
    elif kind == 2:  # some zero differences
        x = sample(n, 1)
        y = [xi if rng.random() < 0.2 else round(rng.uniform(-5, 5), 1) for xi in x]
    else:            # shifted continuous
        x = sample(n)
        y = [xi - 0.8 + rng.gauss(0, 1.5) for xi in x]
    alt = ["two.sided", "less", "greater"][k % 3]
    exact = ["NULL", "NULL", "FALSE", "TRUE"][(k // 3) % 4]
    correct = "FALSE" if k % 7 == 6 else "TRUE"
    signed_cases.append(dict(x=x, y=y, alternative=alt, exact=exact, correct=correct))

ranksum_cases = []
for k in range(36):
    m, n = [(4, 5), (7, 3), (10, 12), (20, 25), (49, 30), (49, 49), (50, 10), (60, 70), (8, 100), (30, 30)][k % 10]
    kind = k % 3
    if kind == 0:
        x, y = sample(m), sample(n, lo=-4, hi=6)
    elif kind == 1:  # ties
        x, y = sample(m, 0), sample(n, 0, lo=-4, hi=6)
    else:            # positions in a list of 50
        x = [float(rng.randint(1, 50)) for _ in range(m)]
        y = [float(rng.randint(1, 50)) for _ in range(n)]
    alt = ["two.sided", "less", "greater"][(k // 2) % 3]
    exact = ["NULL", "NULL", "FALSE", "TRUE"][(k // 3) % 4]
    correct = "FALSE" if k % 5 == 4 else "TRUE"
    ranksum_cases.append(dict(x=x, y=y, alternative=alt, exact=exact, correct=correct))

sign_cases = [dict(k=k, n=n, alternative=a) for (k, n) in [(13, 15), (0, 10), (5, 10), (3, 20), (40, 60), (1, 1)]
              for a in ["two.sided", "less", "greater"]]
psignrank_cases = [dict(q=q, n=n) for (q, n) in [(0, 1), (3, 5), (10, 10), (24, 15), (96, 15), (300, 40), (611, 49)]]
pwilcox_cases = [dict(q=q, m=m, n=n) for (q, m, n) in [(0, 1, 1), (3, 4, 5), (10, 7, 3), (100, 20, 25), (600, 49, 30),
                                                        (1200, 49, 49), (50, 10, 40)]]

lines = ["options(warn = -1)", "out <- function(...) cat(paste(..., sep = ' '), '\\n')",
         "f <- function(v) sprintf('%.17g', v)"]
for i, c in enumerate(signed_cases):
    lines.append("x <- %s; y <- %s" % (rvec(c["x"]), rvec(c["y"])))
    lines.append("t <- wilcox.test(x, y, paired = TRUE, alternative = '%s', exact = %s, correct = %s, conf.int = TRUE)"
                 % (c["alternative"], c["exact"], c["correct"]))
    lines.append("d <- x - y; d <- d[d != 0]; w <- outer(d, d, '+'); w <- w[!lower.tri(w)] / 2")
    lines.append("out('signed', %d, f(t$statistic), f(t$p.value), f(t$estimate), f(median(w)), grepl('exact', t$method))" % i)
for i, c in enumerate(ranksum_cases):
    lines.append("x <- %s; y <- %s" % (rvec(c["x"]), rvec(c["y"])))
    lines.append("t <- wilcox.test(x, y, alternative = '%s', exact = %s, correct = %s, conf.int = TRUE)"
                 % (c["alternative"], c["exact"], c["correct"]))
    lines.append("out('ranksum', %d, f(t$statistic), f(t$p.value), f(t$estimate), f(median(outer(x, y, '-'))), grepl('exact', t$method))" % i)
for i, c in enumerate(sign_cases):
    lines.append("out('sign', %d, f(binom.test(%d, %d, 0.5, alternative = '%s')$p.value))" % (i, c["k"], c["n"], c["alternative"]))
for i, c in enumerate(psignrank_cases):
    lines.append("out('psignrank', %d, f(psignrank(%d, %d)))" % (i, c["q"], c["n"]))
for i, c in enumerate(pwilcox_cases):
    lines.append("out('pwilcox', %d, f(pwilcox(%d, %d, %d)))" % (i, c["q"], c["m"], c["n"]))
lines.append("out('version', R.version$major, R.version$minor)")

with tempfile.NamedTemporaryFile("w", suffix=".R", delete=False) as fh:
    fh.write("\n".join(lines) + "\n")
    script = fh.name
try:
    text = subprocess.run(["Rscript", "--vanilla", script], check=True, capture_output=True, text=True).stdout
finally:
    os.unlink(script)

r_version = ""
for line in text.splitlines():
    f = line.split()
    if not f:
        continue
    if f[0] == "signed" or f[0] == "ranksum":
        c = (signed_cases if f[0] == "signed" else ranksum_cases)[int(f[1])]
        c.update(statistic=float(f[2]), p_value=float(f[3]), r_estimate=float(f[4]), hodges_lehmann=float(f[5]),
                 exact_used=f[6] == "TRUE")
    elif f[0] == "sign":
        sign_cases[int(f[1])]["p_value"] = float(f[2])
    elif f[0] == "psignrank":
        psignrank_cases[int(f[1])]["p"] = float(f[2])
    elif f[0] == "pwilcox":
        pwilcox_cases[int(f[1])]["p"] = float(f[2])
    elif f[0] == "version":
        r_version = f[1] + "." + f[2]

fixtures = {
    "generated_by": "tests/reference/ranks/generate.py",
    "scipy": scipy.__version__,
    "R": r_version,
    "wasserstein": emd_cases,
    "signed_rank": signed_cases,
    "rank_sum": ranksum_cases,
    "sign_test": sign_cases,
    "psignrank": psignrank_cases,
    "pwilcox": pwilcox_cases,
}
# One case per line keeps the file small and its diffs readable.
with open(os.path.join(HERE, "fixtures.json"), "w") as fh:
    fh.write("{\n")
    keys = list(fixtures)
    for i, k in enumerate(keys):
        v = fixtures[k]
        if isinstance(v, list):
            fh.write(" %s: [\n" % json.dumps(k))
            fh.write(",\n".join("  " + json.dumps(c) for c in v))
            fh.write("\n ]")
        else:
            fh.write(" %s: %s" % (json.dumps(k), json.dumps(v)))
        fh.write(",\n" if i + 1 < len(keys) else "\n")
    fh.write("}\n")
print("wrote %s: %d emd, %d signed-rank, %d rank-sum cases (scipy %s, R %s)" % (
    os.path.join(HERE, "fixtures.json"), len(emd_cases), len(signed_cases), len(ranksum_cases), scipy.__version__,
    r_version), file=sys.stderr)
