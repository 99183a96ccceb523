#!/usr/bin/python3
"""Reference values from statsmodels and scipy where R's stats package lacks a
method (Breslow-Day with Tarone's correction, Woolf's interval) or as a second,
independent full-precision computation of the conditional odds ratio
(scipy.stats.contingency.odds_ratio, kind="conditional").

Run from this folder with Debian's python3 (python3-scipy, python3-statsmodels):
    /usr/bin/python3 generate.py
Writes py_fixtures.tsv in the format of reference.R's output. Seeded.
Written with scipy 1.10.1 and statsmodels 0.13.5 (Debian 12).
"""
import random

import numpy as np
import scipy
import statsmodels
from scipy import stats
from scipy.stats.contingency import odds_ratio
from statsmodels.stats.contingency_tables import StratifiedTable, Table2x2


def fmt(v):
    v = float(v)
    if np.isnan(v):
        return "NaN"
    if np.isinf(v):
        return "Inf" if v > 0 else "-Inf"
    return repr(v)


def kv(**kw):
    out = []
    for k, v in kw.items():
        vals = v if isinstance(v, (list, tuple, np.ndarray)) else [v]
        out.append(k + "=" + ",".join(fmt(x) for x in vals))
    return out


rng = random.Random(20270302)
lines = []


def table(scale):
    s = rng.choice([5, 30, 200, 2000, scale])
    return [rng.randint(0, s) for _ in range(4)]


def add_bd(tabs, alpha=0.05):
    # statsmodels' layout is [[a, b], [c, d]] per stratum, as ours.
    arr = np.array([[[t[0], t[1]], [t[2], t[3]]] for t in tabs], dtype=float).transpose(1, 2, 0)
    st = StratifiedTable(arr)
    bd = st.test_equal_odds(adjust=False)
    tarone = st.test_equal_odds(adjust=True)
    df = len(tabs) - 1
    # p from the survival function (statsmodels' 1 - cdf loses small p-values).
    lines.append("\t".join(["bd", ";".join(",".join(str(x) for x in t) for t in tabs)] +
                           kv(statistic=bd.statistic, p=stats.chi2.sf(bd.statistic, df),
                              tarone=tarone.statistic, tarone_p=stats.chi2.sf(tarone.statistic, df),
                              mh_estimate=st.oddsratio_pooled, mh_ci=st.oddsratio_pooled_confint(alpha))))


# Published: statsmodels' own tests (TestStratified2, DescTools-derived) and the
# penicillin data of R's mantelhaen.test help (Agresti 1990).
add_bd([[20, 14, 10, 24], [15, 12, 3, 15], [3, 2, 3, 2], [12, 3, 7, 5], [1, 0, 3, 2]])
add_bd([[313, 512, 19, 89], [207, 353, 8, 17], [205, 120, 391, 202], [278, 139, 244, 131],
        [138, 53, 299, 94], [351, 22, 317, 24]])
for _ in range(40):
    k = rng.randint(2, 8)
    tabs = []
    while len(tabs) < k:
        t = [rng.randint(1, rng.choice([6, 40, 300, 3000])) for _ in range(4)]  # no zero cell
        tabs.append(t)
    add_bd(tabs)

for _ in range(60):
    t = table(10**6)
    conf = rng.choice([0.95, 0.9, 0.99])
    fields = ["woolf", ",".join(str(x) for x in t + [conf])]
    if min(t) > 0:
        ci = Table2x2(np.array([[t[0], t[1]], [t[2], t[3]]], dtype=float)).oddsratio_confint(1 - conf)
        fields += kv(estimate=t[0] * t[3] / (t[1] * t[2]), ci=ci)
        lines.append("\t".join(fields))

for _ in range(60):
    t = table(3000)
    if (t[0] + t[1]) * (t[2] + t[3]) * (t[0] + t[2]) * (t[1] + t[3]) == 0:
        continue
    conf = rng.choice([0.95, 0.9, 0.99])
    alt = rng.choice([0, 1, 2])
    res = odds_ratio(np.array([[t[0], t[1]], [t[2], t[3]]]), kind="conditional")
    ci = res.confidence_interval(confidence_level=conf, alternative=["two-sided", "less", "greater"][alt])
    lines.append("\t".join(["fisher_scipy", ",".join(str(x) for x in t + [alt, conf])] +
                           kv(estimate=res.statistic, ci=[ci.low, ci.high])))

with open("py_fixtures.tsv", "w") as f:
    f.write("# scipy %s, statsmodels %s; written by tests/reference/generate.py\n" % (scipy.__version__, statsmodels.__version__))
    f.write("\n".join(lines) + "\n")
