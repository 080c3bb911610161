#!/bin/sh
# cw-wear is monotone in each stressor: hotter, fuller or deeper never ages
# less.  Reference: the stress functions of Xu et al., IEEE Trans. Smart
# Grid 9(2):1131-1140, 2018, are strictly increasing in temperature
# (S_T), SoC (S_s) and depth (S_d, for 0 < d <= 1 with the published
# constants), and the fade L(f) in the damage f; for cycles around a fixed
# mean, a larger amplitude also spends more time at SoC far from 50 %,
# where the convex exp() of S_s weighs more.  So within each sweep below,
# where one stressor grows and the rest of the history is the same, the
# damage and the fade must strictly grow, and hours at high SoC or heat
# must not shrink.  Histories: 20 days, a row every 10 minutes, triangle
# SoC cycles of period 8 h, temperature wandering 5 C about its base.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import math, sys
tmp = sys.argv[1]
sweeps = {
    "hotter": [(50, 30, b) for b in (-20, -5, 0, 10, 20, 30, 40)],
    "hotter-rest": [(50, 0, b) for b in (-20, 0, 15, 25, 35, 50)],
    "fuller": [(m, 15, 25) for m in (16, 30, 45, 50, 60, 75, 84)],
    "deeper": [(50, a, 25) for a in (2, 5, 10, 20, 30, 40, 49)],
    "deeper-low": [(30, a, 25) for a in (2, 5, 10, 20, 29)],
    "deeper-hot": [(65, a, 40) for a in (2, 8, 16, 25, 34)],
}
with open(tmp + "/in.csv", "w") as f:
    f.write("device,time,current_a,temp_c,soc_pct\n")
    for k in range(20 * 144 + 1):
        t = 1767225600 + 600 * k
        ph = (k % 48) / 48.0
        tri = 4 * ph - 1 if ph < 0.5 else 3 - 4 * ph      # -1 .. 1 .. -1
        wob = 5 * math.sin(k / 37.0)
        for name, pts in sweeps.items():
            for i, (m, a, base) in enumerate(pts):
                cur = 2.0 if ph < 0.5 else -2.0
                f.write("%s-%d,%d,%g,%.4f,%.4f\n" % (name, i, t, cur, base + wob, m + a * tri))
import json
json.dump(sweeps, open(tmp + "/sweeps.json", "w"))
PY
cw-wear "$tmp/in.csv" >"$tmp/out.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import csv, json, sys
tmp = sys.argv[1]
sweeps = json.load(open(tmp + "/sweeps.json"))
rows = {r["device"]: r for r in csv.DictReader(open(tmp + "/out.csv"))}
bad = 0
for name, pts in sweeps.items():
    got = [rows["%s-%d" % (name, i)] for i in range(len(pts))]
    for col, strict in (("damage", True), ("fade_pct", True),
                        ("hours_near_full", False), ("hours_hot", False)):
        v = [float(r[col]) for r in got]
        ok = all((b > a) if strict else (b >= a) for a, b in zip(v, v[1:]))
        print("%s %s %s: %s" % ("ok  " if ok else "FAIL", name, col, " ".join("%.6g" % x for x in v)))
        bad += not ok
    if name.startswith("deeper"):
        v = [float(r["efc"]) for r in got]
        ok = all(b > a for a, b in zip(v, v[1:]))
        print("%s %s efc: %s" % ("ok  " if ok else "FAIL", name, " ".join("%.6g" % x for x in v)))
        bad += not ok
sys.exit(1 if bad else 0)
PY
