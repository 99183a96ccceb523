#!/usr/bin/python3
"""Prints bench/ranks results side by side: twinprobe against scipy and R.

Usage: compare.py DIR   (DIR holds cpp.jsonl, scipy.jsonl, r.jsonl)
A ratio is reference time / twinprobe time (above 1: twinprobe is faster).
Permutation tests in scipy ran on a subset of listings; their time is scaled
to all listings. "same" says whether both sides computed the same numbers
(sums of distances or p-values, relative 1e-9); permutation p-values come
from different random streams, so there the mean p-values are shown instead.
"""
import json
import sys

d = sys.argv[1]


def load(name):
    out = {}
    try:
        with open(d + "/" + name) as fh:
            for line in fh:
                if line.strip():
                    j = json.loads(line)
                    out[j["measure"]] = j
    except FileNotFoundError:
        pass
    return out


cpp, sp, r = load("cpp.jsonl"), load("scipy.jsonl"), load("r.jsonl")
n = cpp["emd"]["count"]


def scaled(ref, m):
    if m not in ref:
        return None
    j = ref[m]
    return j["seconds"] * (n / j["count"]) if j["count"] else j["seconds"]


def same(a, b, m):
    if m.startswith("perm_"):
        return "mean p %.3f vs %.3f" % (a["check"] / a["count"], b["check"] / b["count"])
    ok = abs(a["check"] - b["check"]) <= 1e-9 * max(1.0, abs(b["check"]))
    return "same" if ok else "DIFFERENT (%.12g vs %.12g)" % (a["check"], b["check"])


print("bench/ranks: %d listings x 50 positions, inland vs coastal (CPU seconds)" % n)
print("%-16s %12s %12s %9s %12s %9s  %s" % ("measure", "twinprobe", "scipy", "ratio", "R", "ratio", "check"))
for m in ["exposure", "emd", "mann_whitney", "signed_rank", "perm_gap", "perm_emd", "neighbour", "widest_split"]:
    if m not in cpp:
        continue
    c = cpp[m]["seconds"]
    s, rr = scaled(sp, m), scaled(r, m)
    checks = []
    if m in sp:
        checks.append("scipy " + same(cpp[m], sp[m], m) + ("" if sp[m]["count"] == n else " (%d listings, scaled)" % sp[m]["count"]))
    if m in r:
        checks.append("R " + same(cpp[m], r[m], m))
    print("%-16s %12.4f %12s %9s %12s %9s  %s" % (
        m, c, "%.4f" % s if s is not None else "-", "%.1f" % (s / c) if s else "-",
        "%.4f" % rr if rr is not None else "-", "%.1f" % (rr / c) if rr else "-", "; ".join(checks) or "no reference"))
for m in ["store_load", "analyze_listings"]:
    if m in cpp:
        extra = " (%d permutation tests)" % cpp[m]["count"] if m == "analyze_listings" else ""
        print("%-16s %12.4f%s" % (m, cpp[m]["seconds"], extra))
print("peak memory (MB): twinprobe %.1f, scipy %s, R %s" % (
    cpp["peak_rss_mb"]["check"], "%.1f" % sp["peak_rss_mb"]["check"] if "peak_rss_mb" in sp else "-",
    "%.1f" % r["peak_rss_mb"]["check"] if "peak_rss_mb" in r else "-"))
