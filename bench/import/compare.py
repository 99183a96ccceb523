"""Compares `twinprobe analyze --json` with bench/import/analyze_reference.R.

Usage: compare.py ANALYZE.json R_OUTPUT.txt
Counts must be equal; other numbers equal to 1e-9 relative (both below
1e-300 count as equal: R and twinprobe both underflow such p-values).
Prints one line per number and exits 1 on any difference.
"""
import json
import sys


def main():
    analysis = json.load(open(sys.argv[1]))
    ours = {}
    table = analysis["paired"]["table"]
    for cell in "abcd":
        ours["paired." + cell] = table[cell]
    ours["mcnemar_exact_p"] = analysis["paired"]["mcnemar_exact_p"]
    for across in analysis["effects"]["across_strata"]:
        column = across["column"]
        ours[column + ".mh_estimate"] = across["mantel_haenszel"]["estimate"]
        ours[column + ".cmh_statistic_corrected"] = across["cmh"]["statistic_corrected"]
        ours[column + ".cmh_p_corrected"] = across["cmh"]["p_corrected"]
    bad = 0
    for line in open(sys.argv[2]):
        key, value = line.split()
        theirs = float(value)
        mine = ours.get(key)
        if mine is None:
            same = False
        elif key.startswith("paired."):
            same = int(mine) == int(theirs)
        else:
            mine = float(mine)
            same = (abs(mine) < 1e-300 and abs(theirs) < 1e-300) or abs(mine - theirs) <= 1e-9 * max(abs(mine), abs(theirs))
        print(f"  {key:36s} twinprobe {mine!s:>24s}  R {value:>24s}  {'same' if same else 'DIFFERENT'}")
        bad += not same
    sys.exit(1 if bad else 0)


main()
