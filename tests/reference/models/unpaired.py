"""Reference values for stats/newcombe.h and stats/impact.h, run live by
tests/stats/unpaired_measures_test.cpp with Debian's python3-statsmodels:
    /usr/bin/python3 unpaired.py IN.tsv OUT.txt
IN.tsv: rows "x1 n1 x2 n2 conf" (no header). For row i writes
    newcombe_i low high   confint_proportions_2indep(compare="diff", method="newcomb")
    katz_i low high       ... compare="ratio", method="log"
    koopman_i low high    ... compare="ratio", method="score", correction=False
"""
import sys
import warnings

from statsmodels.stats.proportion import confint_proportions_2indep as ci

warnings.simplefilter("ignore")
rows = [line.split() for line in open(sys.argv[1]) if line.strip()]
with open(sys.argv[2], "w") as out:
    for i, (x1, n1, x2, n2, conf) in enumerate(rows):
        x1, n1, x2, n2, alpha = int(x1), int(n1), int(x2), int(n2), 1 - float(conf)
        for key, compare, method, extra in (("newcombe", "diff", "newcomb", {}),
                                            ("katz", "ratio", "log", {}),
                                            ("koopman", "ratio", "score", {"correction": False})):
            if method == "log" and 0 in (x1, x2):
                continue  # Katz's variance is undefined with a zero count
            low, high = ci(x1, n1, x2, n2, compare=compare, method=method, alpha=alpha, **extra)
            out.write("%s_%d %r %r\n" % (key, i, float(low), float(high)))
