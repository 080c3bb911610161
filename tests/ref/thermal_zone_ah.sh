#!/bin/sh
# cw-thermal --summary over long random streams against an independent
# Python reference (Debian's /usr/bin/python3 with numpy), written apart
# from lib/thermal.c and by another method (whole arrays, np.bincount):
#   charge: 1 Ah = 1 A for 3600 s (definition of the ampere-hour), each
#     row's current over the interval since the previous row of its device
#     (cellwear(7) sample stream, lib/charge.h), no charge over an interval
#     longer than --max-gap (default 15 min) or not positive;
#   charging: current above --min-current (default 0.05 A);
#   zones: the JEITA guideline's zone scheme, thresholds T1..T4
#     (default 0, 10, 45, 60 C), with cw-thermal's documented rule that a
#     reading exactly at a threshold belongs to the zone nearer normal;
#     compared in exact rational arithmetic (fractions), readings being
#     decimals with one digit, many of them exactly at a threshold;
#   Fahrenheit limits: C = (F - 32) * 5 / 9 (definition of the scale),
#     exactly, for a second run with random limits given in F.
# Checked per device: first, last, charge_ah, the Ah of each zone, the Ah
# without temperature, outside_pct and unjudged_rows.  Devices are
# interleaved and the stream is split into a plain and a gzipped file.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import csv, gzip, io, subprocess, sys
from datetime import datetime, timezone
from fractions import Fraction as Q
import numpy as np

tmp = sys.argv[1]
rng = np.random.default_rng(20260114)
T0 = 1767225600
NDEV, NROW = 40, 1500

def temp_strings(n):
    # Tenths of a degree from -30.0 to 75.0, a fifth of them within
    # 0.1 C of a default threshold, including the threshold itself.
    k = rng.integers(-300, 751, n)
    near = rng.random(n) < 0.2
    thr = rng.choice([0, 100, 450, 600], n) + rng.integers(-1, 2, n)
    k = np.where(near, thr, k)
    s = ["%d.%d" % (v // 10, v % 10) if v >= 0 else
         "-%d.%d" % ((-v) // 10, (-v) % 10) for v in k]
    empty = rng.random(n) < 0.03
    return [("" if e else x) for x, e in zip(s, empty)]

def cur_strings(n):
    c = np.round(rng.uniform(-12, 12, n), 3)
    pick = rng.random(n)
    c = np.where(pick < 0.1, 0.05, c)
    c = np.where((pick >= 0.1) & (pick < 0.15), 0.051, c)
    c = np.where((pick >= 0.15) & (pick < 0.2), 0.0, c)
    c = np.where((pick >= 0.2) & (pick < 0.25), -0.05, c)
    s = ["%.3f" % x for x in c]
    empty = rng.random(n) < 0.02
    return [("" if e else x) for x, e in zip(s, empty)]

steps = np.array([0, 1, 10, 30, 60, 61, 300, 899, 900, 901, 3600])
rows = []
dev = {}
for d in range(NDEV):
    name = "D%03d" % d
    dt = rng.choice(steps, NROW, p=[.02, .05, .2, .2, .3, .05, .08, .03,
                                    .03, .02, .02])
    t = T0 + rng.integers(0, 7200) + np.cumsum(dt)
    ts, cs = temp_strings(NROW), cur_strings(NROW)
    soc = rng.integers(0, 101, NROW)
    dev[name] = (t, cs, ts)
    for k in range(NROW):
        rows.append((int(t[k]), name, cs[k], ts[k], int(soc[k])))
rows.sort(key=lambda r: r[0])		# stable: per device order kept
lines = ["%s,%d,3.7,%s,%s,%d\n" % (r[1], r[0], r[2], r[3], r[4])
         for r in rows]
half = len(lines) // 2
hdr = "soc_pct,device,time,voltage_v,current_a,temp_c\n"
# Columns in another order than cw-clean writes: found by name.
def reorder(l):
    d, t, v, c, tc, s = l.rstrip("\n").split(",")
    return ",".join([s, d, t, v, c, tc]) + "\n"
with open(tmp + "/a.csv", "w") as f:
    f.write(hdr + "".join(reorder(l) for l in lines[:half]))
with gzip.open(tmp + "/b.csv.gz", "wt") as f:
    f.write(hdr + "".join(reorder(l) for l in lines[half:]))

def expect(lim):
    out = {}
    for name, (t, cs, ts) in dev.items():
        i = np.array([float(c) if c else np.nan for c in cs])
        dt = np.diff(t, prepend=t[0]).astype(float)
        dt[0] = 0
        ok = (dt > 0) & (dt <= 900) & ~np.isnan(i)
        ah = np.where(ok, np.nan_to_num(i) * dt / 3600.0, 0.0)
        charging = ~np.isnan(i) & (i > 0.05)
        zone = np.full(len(t), 5)		# 5: no temperature
        for k, s in enumerate(ts):
            if not s:
                continue
            x = Q(s)
            zone[k] = (0 if x < lim[0] else 1 if x < lim[1] else
                       2 if x <= lim[2] else 3 if x <= lim[3] else 4)
        per = np.bincount(zone[charging], weights=ah[charging],
                          minlength=6)
        known = per[:5].sum()
        unj = sum(1 for k in range(len(t)) if not ts[k] or not cs[k])
        out[name] = dict(first=int(t[0]), last=int(t[-1]),
                         charge_ah=per.sum(), z=per[:5], no_temp=per[5],
                         outside=(100 * (known - per[2]) / known
                                  if known > 0 else None), unjudged=unj)
    return out

def run(args):
    p = subprocess.run(["cw-thermal", "-s"] + args +
                       [tmp + "/a.csv", tmp + "/b.csv.gz"],
                       capture_output=True, text=True)
    if p.returncode != 0:
        sys.exit("cw-thermal failed: " + p.stderr)
    return list(csv.DictReader(io.StringIO(p.stdout)))

def epoch(s):
    return int(datetime.strptime(s, "%Y-%m-%dT%H:%M:%SZ")
               .replace(tzinfo=timezone.utc).timestamp())

bad = 0
def close(what, got, want):
    global bad
    g = float(got) if got != "" else None
    if want is None or g is None:
        ok = g is None and want is None
    else:
        ok = abs(g - want) <= 1e-9 * abs(want) + 1e-12
    if not ok:
        bad += 1
        if bad < 20:
            print("MISMATCH", what, "got", got, "want", want)

def check(label, args, lim, need_zones=False):
    want = expect(lim)
    got = run(args)
    names = [r["device"] for r in got]
    if names != sorted(want):
        sys.exit(label + ": devices differ or are not sorted")
    zcols = ["ah_below_min", "ah_cool", "ah_normal", "ah_warm",
             "ah_above_max"]
    nz = 0
    for r in got:
        w = want[r["device"]]
        d = label + " " + r["device"]
        close(d + " first", epoch(r["first"]), w["first"])
        close(d + " last", epoch(r["last"]), w["last"])
        close(d + " charge_ah", r["charge_ah"], w["charge_ah"])
        for c, x in zip(zcols, w["z"]):
            close(d + " " + c, r[c], x)
            nz += x != 0
        close(d + " ah_no_temp", r["ah_no_temp"], w["no_temp"])
        close(d + " outside_pct", r["outside_pct"], w["outside"])
        close(d + " unjudged_rows", r["unjudged_rows"], w["unjudged"])
    # The data must exercise every zone, or the check proves little.
    if need_zones and nz < 5 * len(got) * 0.9:
        sys.exit(label + ": too few non-empty zones in the test data")
    print(label, "ok:", len(got), "devices")

check("default", [], [Q(0), Q(10), Q(45), Q(60)], True)
# Random limits in tenths of a degree F, converted exactly.
for trial in range(3):
    f = np.sort(rng.integers(-100, 1500, 4))
    fs = ["%d.%dF" % (v // 10, v % 10) if v >= 0 else
          "-%d.%dF" % ((-v) // 10, (-v) % 10) for v in f]
    lim = [(Q(s[:-1]) - 32) * Q(5, 9) for s in fs]
    check("limits " + ",".join(fs), ["--limits", ",".join(fs)], lim)
if bad:
    sys.exit("%d mismatches" % bad)
PY
