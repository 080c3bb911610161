#!/bin/sh
# cw-dcir --trend against scipy.stats.theilslopes (Debian's
# /usr/bin/python3 with python3-scipy): the Theil-Sen slope, Sen's
# confidence interval (alpha 0.95) and the intercept of
# method='joint' (median of y - slope x), fitted to the same points:
# x = days from the device's first step, y = r_ref, which Python works out
# itself from the logged voltages and currents (R = dV / dI) and the
# Arrhenius formula with scipy.constants (Ea 30 kJ/mol, 25 C).  From the
# fit it derives r_start, r_end, growth_pct, growth_pct_per_30d and the
# date at 200 % of r_start (datetime; only when the interval's lower end
# is above zero), and compares every column.
# Invented devices:
#   GROW   400 steps over 300 days, noise and 5 % glitches (contact
#          bounces reading 3 to 10 times the resistance)
#   TIES   voltages logged to 1 mV, one temperature and one current, so
#          many equal r_ref (ties in y, Sen's tie correction)
#   FALL   falling resistance: growth negative, eol_date empty
#   FEW    6 steps: a row with empty estimates
#   SHORT  20 steps within 5 days (less than --min-span 7d): the same
#   BIG    3000 steps; with --max-points 1000 cw-dcir keeps the first
#          step of each time bucket of 2^L s at the lowest L that leaves
#          at most 1000 (its documented thinning), which Python works out
#          itself; scipy gets those steps
# Then the glitch check: GROW with one extra glitch (a step near the end,
# where it pulls a line most, reading 20 times the resistance) moves the Theil-Sen slope by less than a
# tenth of its confidence interval, while the least-squares slope
# (numpy.polyfit) of the same points moves by more than the whole
# interval: the glitch is large enough to matter to a fit that is not
# robust.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import math, subprocess, sys
from datetime import datetime, timezone, timedelta
import numpy as np
from scipy.stats import theilslopes
from scipy.constants import R as RG, zero_Celsius as ZC

tmp = sys.argv[1]
rng = np.random.default_rng(1968)
T0 = 1767225600				# 2026-01-01T00:00:00Z

def device(name, n, days, r0, slope, vdec=6, glitch=0.0, extra=None,
           fixed=False):
    """Rows of n step events at random times over DAYS; returns the rows
    and the (t, r_ref) that Python expects from the logged values."""
    # Minutes apart at least, so the 30 s events never overlap.
    ts = np.sort(rng.choice(int(days * 1440), n, replace=False)) * 60 + T0
    rows, pts = [], []
    for k, t in enumerate(ts):
        t = int(t)
        tc = 25.0 if fixed else round(float(rng.uniform(12, 40)), 1)
        d = (t - T0) / 86400
        r25 = r0 + slope * d + float(rng.normal(0, 0.02 * r0))
        r = r25 * math.exp(30e3 / RG * (1 / (tc + ZC) - 1 / (25 + ZC)))
        u, g = float(rng.random()), float(rng.uniform(3, 10))
        if k == extra:
            r *= 20
        elif u < glitch:
            r *= g
        i0, i1 = -0.2, -4.2 if fixed else round(float(rng.uniform(-6, -1)), 2)
        fmt = "%%.%df" % vdec
        v0 = float(fmt % (48.0 + i0 * r))
        v1 = float(fmt % (48.0 + i1 * r))
        for j in range(3):
            rows.append((t - 30 + 10 * j, "%s,%d,%s,%.2f,%.1f,50" % (
                name, t - 30 + 10 * j, fmt % v0, i0, tc)))
        rows.append((t, "%s,%d,%s,%.2f,%.1f,50" % (name, t, fmt % v1, i1, tc)))
        rr = (v1 - v0) / (i1 - i0)
        rref = rr * math.exp(-(30e3 / RG) * (1 / (tc + ZC) - 1 / (25 + ZC)))
        pts.append((t, rref))
    return rows, pts

def write(path, devs):
    rows = sorted((r for d in devs for r in d[0]), key=lambda r: r[0])
    with open(path, "w") as f:
        f.write("device,time,voltage_v,current_a,temp_c,soc_pct\n")
        f.writelines(r[1] + "\n" for r in rows)

def trend(path, *opts):
    p = subprocess.run(["cw-dcir", "-t", *opts, path], capture_output=True,
                       text=True)
    assert p.returncode == 0, p.stderr
    lines = p.stdout.splitlines()
    head = lines[0].split(",")
    return {f[0]: dict(zip(head, f)) for f in (l.split(",") for l in lines[1:])}

def expected(pts):
    t = np.array([p[0] for p in pts], dtype=float)
    y = np.array([p[1] for p in pts])
    x = (t - t[0]) / 86400
    res = theilslopes(y, x, 0.95, method="joint")
    e = {"slope_ohm_per_day": res[0], "r_start_ohm": res[1],
         "slope_lo_ohm_per_day": res[2], "slope_hi_ohm_per_day": res[3]}
    return e, x

bad = 0
def compare(name, row, e, scale):
    global bad
    for k, v in e.items():
        if row[k] == "" and v is None:
            continue
        if (row[k] == "") != (v is None) or \
           (isinstance(v, str) and row[k] != v) or \
           (isinstance(v, float) and abs(float(row[k]) - v) >
            1e-8 * (abs(v) + scale)):
            print("%s %s: cw-dcir %r, reference %r" % (name, k, row[k], v))
            bad += 1

def full(name, pts, row, kept=None):
    e, x = expected(pts if kept is None else kept)
    xl = (pts[-1][0] - pts[0][0]) / 86400
    r0, b = e["r_start_ohm"], e["slope_ohm_per_day"]
    e["r_end_ohm"] = r0 + b * xl
    e["growth_pct"] = 100 * (e["r_end_ohm"] - r0) / r0
    e["growth_pct_per_30d"] = 100 * b * 30 / r0
    e["eol_date"] = (datetime.fromtimestamp(pts[0][0], timezone.utc) +
        timedelta(days=r0 / b)).strftime("%Y-%m-%d") \
        if b > 0 and e["slope_lo_ohm_per_day"] > 0 else None
    e["steps"] = str(len(pts))
    e["fit_steps"] = str(len(pts if kept is None else kept))
    compare(name, row, e, 1e-6 * abs(r0))
    return e

grow = device("GROW", 400, 300, 0.050, 0.00008, glitch=0.05)
ties = device("TIES", 150, 120, 0.080, 0.0001, vdec=3, fixed=True)
fall = device("FALL", 80, 90, 0.070, -0.00005)
few = device("FEW", 6, 60, 0.05, 0.0001)
short = device("SHORT", 20, 5, 0.05, 0.0001)
write(tmp + "/a.csv", [grow, ties, fall, few, short])
got = trend(tmp + "/a.csv")
assert sorted(got) == ["FALL", "FEW", "GROW", "SHORT", "TIES"], sorted(got)
for name, d in (("GROW", grow), ("TIES", ties), ("FALL", fall)):
    full(name, d[1], got[name])
ys = [p[1] for p in ties[1]]
assert len(set(ys)) < len(ys) - 20, "TIES has too few ties to test them"
assert got["FALL"]["eol_date"] == "" and float(got["FALL"]["growth_pct"]) < 0
for name, d in (("FEW", few), ("SHORT", short)):
    row = got[name]
    empty = [k for k in row if k not in ("device", "steps", "first", "last",
             "soc_gate") and row[k] != ""]
    if row["steps"] != str(len(d[1])) or empty:
        print(name, "should have only steps and times:", row)
        bad += 1

big = device("BIG", 3000, 400, 0.040, 0.00003, glitch=0.02)
write(tmp + "/b.csv", [big])
# The thinning of cw-dcir(1): of the steps in one time bucket of 2^L
# seconds from the epoch (and one SoC bin: all at 50 % here) the first,
# at the lowest L that leaves at most --max-points.
def thinned(pts, cap):
    L = 0
    while True:
        kept, seen = [], set()
        for p in pts:
            b = math.floor(p[0] / 2 ** L)
            if b not in seen:
                seen.add(b)
                kept.append(p)
        if len(kept) <= cap:
            return kept
        L += 1
kept = thinned(big[1], 1000)
assert 500 < len(kept) <= 1000, len(kept)
full("BIG", big[1], trend(tmp + "/b.csv", "--max-points", "1000")["BIG"],
     kept=kept)
full("BIG-all", big[1], trend(tmp + "/b.csv", "--max-points", "4096")["BIG"])

# One more glitch in GROW.
n = len(grow[1])
rng = np.random.default_rng(1968)	# the same GROW again, glitch at 200
grow2 = device("GROW", 400, 300, 0.050, 0.00008, glitch=0.05, extra=n - 5)
diff = [k for k in range(n) if grow[1][k] != grow2[1][k]]
assert diff == [n - 5], diff
write(tmp + "/c.csv", [grow2])
g1 = got["GROW"]
g2 = trend(tmp + "/c.csv")["GROW"]
ci = float(g1["slope_hi_ohm_per_day"]) - float(g1["slope_lo_ohm_per_day"])
moved = abs(float(g2["slope_ohm_per_day"]) - float(g1["slope_ohm_per_day"]))
def ols(pts):
    t = np.array([p[0] for p in pts], dtype=float) / 86400
    return np.polyfit(t, [p[1] for p in pts], 1)[0]
olsmoved = abs(ols(grow2[1]) - ols(grow[1]))
print("glitch: Theil-Sen slope moved %.3g, least squares %.3g, CI width %.3g"
      % (moved, olsmoved, ci))
if not (moved < ci / 10 and olsmoved > ci):
    print("glitch check failed")
    bad += 1
print("Theil-Sen trend vs scipy.stats.theilslopes: %d bad" % bad)
sys.exit(1 if bad else 0)
PY
