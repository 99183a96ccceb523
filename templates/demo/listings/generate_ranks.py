#!/usr/bin/env python3
"""Writes ranks.csv: invented candidate rankings for the demo's listing audit.

Everything here is invented. "Kestrel Board (invented)" is a fictional job
board in the invented country of Veldmark; recruiters search its candidate
profiles by occupation (query) and town (location: Orlinde, Brakkeport,
Tessvale). Each candidate is a key (no names) with a gender (f, m) and an
origin (inland, coastal) signalled on the profile.

The model (the demo's known truth):
  - each query x location has a pool of 30 candidates; gender and origin are
    drawn independently with probability 1/2 each;
  - a candidate's merit is standard normal;
  - the board's score is merit + 0.8 for an inland origin (a built-in origin
    bias), - 0.7 for women searched as "junior developer" (a gender bias in
    one occupation only), plus fresh normal noise (sd 0.25) on every fetch;
  - a listing shows the 20 highest scores, best first;
  - each query x location was fetched three times: by the invented recruiter
    account recruiter-1 on two days and by recruiter-2 on the first day, so
    recruiter-1 vs recruiter-1 is the noise floor for personalisation.
Seed: random.Random(20270301); Python's Mersenne Twister gives the same
stream on every platform, so rerunning this script rewrites the same file.

Run: python3 templates/demo/listings/generate_ranks.py
"""
import os
import random

rng = random.Random(20270301)
queries = ["bookkeeper", "warehouse clerk", "care assistant", "junior developer"]
towns = ["Orlinde", "Brakkeport", "Tessvale"]
fetches = [("recruiter-1", "2027-03-02T10:00"), ("recruiter-2", "2027-03-02T10:05"), ("recruiter-1", "2027-03-09T10:00")]

rows = ["listing,query,location,seen_by,fetched_at,position,item,gender,origin"]
n_listing = 0
for qi, query in enumerate(queries):
    for ti, town in enumerate(towns):
        pool = []
        for c in range(30):
            gender = "f" if rng.random() < 0.5 else "m"
            origin = "inland" if rng.random() < 0.5 else "coastal"
            key = "K%d%d%02d" % (qi + 1, ti + 1, c + 1)
            pool.append((key, gender, origin, rng.gauss(0.0, 1.0)))
        for seen_by, fetched_at in fetches:
            n_listing += 1
            scored = []
            for key, gender, origin, merit in pool:
                score = merit + (0.8 if origin == "inland" else 0.0)
                if query == "junior developer" and gender == "f":
                    score -= 0.7
                score += rng.gauss(0.0, 0.25)
                scored.append((score, key, gender, origin))
            scored.sort(key=lambda s: -s[0])
            for position, (_, key, gender, origin) in enumerate(scored[:20], start=1):
                rows.append("L%03d,%s,%s,%s,%s,%d,%s,%s,%s" % (n_listing, query, town, seen_by, fetched_at, position,
                                                                  key, gender, origin))

path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "ranks.csv")
with open(path, "w", newline="") as fh:
    fh.write("\n".join(rows) + "\n")
print("wrote %s (%d listings, %d rows)" % (path, n_listing, len(rows) - 1))
