#!/bin/sh
# cw-thermal events over random streams against a second implementation
# of the rules of cw-thermal(1), in Python (Debian's /usr/bin/python3 with
# numpy), written from the manual page, not from lib/thermal.c, and by
# another method: whole arrays per device, runs found first, then merged
# as a list, then every column computed again from the rows of the span.
# The outside references are the definitions it rests on: 1 Ah = 1 A for
# 3600 s (each row's current over the interval since the previous row,
# cw-thermal(1)), the JEITA guideline's zone scheme (T1..T4, default 0, 10,
# 45, 60 C); the rest (hysteresis, merge, minimum duration, gaps) is
# cw-thermal's own documented design, so this check shows that the
# streaming engine does what the manual says, on data no one wrote by
# hand.  Several option sets; devices interleaved; two input files.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import csv, io, math, subprocess, sys
from datetime import datetime, timezone
import numpy as np

tmp = sys.argv[1]
rng = np.random.default_rng(4242)
T0 = 1767225600
NDEV, NROW = 30, 3000

def walk(n, lo, hi, step):
    x = np.empty(n)
    v = rng.uniform(lo, hi)
    for k in range(n):
        v = min(hi, max(lo, v + rng.normal(0, step)))
        x[k] = v
    return x

dev = {}
rows = []
for d in range(NDEV):
    name = "P%02d" % d
    dt = rng.choice([0, 5, 30, 60, 60, 60, 120, 600, 901, 2000], NROW,
                    p=[.01, .1, .2, .2, .2, .1, .1, .05, .02, .02])
    t = T0 + rng.integers(0, 3600) + np.cumsum(dt)
    temp = np.round(walk(NROW, -35, 75, 1.5), 1)
    # Current in regimes: charge, rest, discharge, with noise.
    reg = np.repeat(rng.choice([2.0, 0.0, -4.0], NROW // 20 + 1),
                    20)[:NROW]
    cur = np.round(reg + rng.normal(0, 0.3, NROW) * (reg != 0) +
                   rng.normal(0, 0.03, NROW) * (reg == 0), 3)
    soc = np.round(np.clip(50 + np.cumsum(reg) * 0.01, 0, 100), 1)
    tmiss = rng.random(NROW) < 0.02
    cmiss = rng.random(NROW) < 0.01
    smiss = rng.random(NROW) < 0.05
    ts = ["" if m else "%.1f" % v for v, m in zip(temp, tmiss)]
    cs = ["" if m else "%.3f" % v for v, m in zip(cur, cmiss)]
    ss = ["" if m else "%.1f" % v for v, m in zip(soc, smiss)]
    dev[name] = dict(t=t, temp=np.array([float(x) if x else np.nan
                                         for x in ts]),
                     i=np.array([float(x) if x else np.nan for x in cs]),
                     soc=np.array([float(x) if x else np.nan for x in ss]))
    for k in range(NROW):
        rows.append((int(t[k]), name, cs[k], ts[k], ss[k]))
rows.sort(key=lambda r: r[0])
hdr = "device,time,current_a,temp_c,soc_pct\n"
lines = ["%s,%d,%s,%s,%s\n" % (r[1], r[0], r[2], r[3], r[4]) for r in rows]
half = len(lines) // 3
open(tmp + "/a.csv", "w").write(hdr + "".join(lines[:half]))
open(tmp + "/b.csv", "w").write(hdr + "".join(lines[half:]))

def zone(lim, x):
    return (0 if x < lim[0] else 1 if x < lim[1] else 2 if x <= lim[2]
            else 3 if x <= lim[3] else 4)

SEV = [2, 1, 0, 1, 2]
ZN = ["below-min", "cool", "normal", "warm", "above-max"]

def events(o):
    out = []
    for name, D in dev.items():
        t, temp, i, soc = D["t"], D["temp"], D["i"], D["soc"]
        n = len(t)
        dt = np.diff(t, prepend=t[0])
        brk = np.ones(n, bool)
        brk[1:] = dt[1:] > o["max_gap"]
        t0 = np.where(brk, t, np.roll(t, 1))
        ah = np.where(~brk & (dt > 0) & ~np.isnan(i),
                      np.nan_to_num(i) * dt / 3600.0, 0.0)
        judged = ~np.isnan(temp) & ~np.isnan(i)
        for kind in ("charge", "use"):
            lo, hi = ((o["lim"][1], o["lim"][2]) if kind == "charge"
                      else o["use"])
            act = (i > o["min_i"]) if kind == "charge" else (i < -o["min_i"])
            h = o["hyst"]
            # 1. Runs: (side, first row, last row), Schmitt trigger.
            runs, side = [], 0
            for k in range(n):
                if brk[k]:
                    side = 0
                new = 0
                if judged[k] and act[k]:
                    x = temp[k]
                    if side < 0:
                        new = 1 if x > hi else (-1 if x < lo + h else 0)
                    elif side > 0:
                        new = -1 if x < lo else (1 if x > hi - h else 0)
                    else:
                        new = -1 if x < lo else (1 if x > hi else 0)
                if new != 0 and new == side and not brk[k]:
                    runs[-1][2] = k
                elif new != 0:
                    runs.append([new, k, k])
                side = new
            # 2. Merge consecutive runs of one side, no gap between.
            merged = []
            for r in runs:
                if merged:
                    m = merged[-1]
                    gap = t0[r[1]] - t[m[2]]
                    if (m[0] == r[0] and o["merge"] > 0 and
                            gap <= o["merge"] and
                            not brk[m[2] + 1:r[1] + 1].any()):
                        m[2] = r[2]
                        m[3].append(r)
                        continue
                merged.append([r[0], r[1], r[2], [r]])
            # 3. Columns from the rows of each span; 4. minimum duration.
            for s, a, b, parts in merged:
                start, end = t0[a], t[b]
                if end - start < o["min_dur"]:
                    continue
                tt = temp[a:b + 1]
                tt = tt[~np.isnan(tt)]
                if kind == "charge":
                    zs = [zone(o["lim"], temp[k]) for p in parts
                          for k in range(p[1], p[2] + 1)]
                    z = max(zs, key=lambda q: SEV[q])
                else:
                    z = 0 if s < 0 else 4
                socs = [soc[a - 1] if not brk[a] else soc[a]] + \
                    list(soc[a:b + 1])
                socs = [x for x in socs if not math.isnan(x)]
                out.append(dict(device=name, kind=kind, zone=ZN[z],
                                start=int(start), end=int(end),
                                duration_s=float(end - start),
                                temp_min_c=tt.min(), temp_max_c=tt.max(),
                                charge_ah=ah[a:b + 1].sum(),
                                soc_start_pct=socs[0] if socs else None,
                                soc_end_pct=socs[-1] if socs else None))
    return out

def epoch(s):
    return int(datetime.strptime(s, "%Y-%m-%dT%H:%M:%SZ")
               .replace(tzinfo=timezone.utc).timestamp())

def num(s):
    return None if s == "" else float(s)

bad = 0
def same(what, g, w):
    global bad
    if g is None or w is None:
        ok = g is None and w is None
    else:
        ok = abs(g - w) <= 1e-9 * abs(w) + 1e-12
    if not ok:
        bad += 1
        if bad <= 20:
            print("MISMATCH", what, "got", g, "want", w)

def check(label, args, o):
    p = subprocess.run(["cw-thermal"] + args + [tmp + "/a.csv",
                       tmp + "/b.csv"], capture_output=True, text=True)
    if p.returncode != 0:
        sys.exit("cw-thermal failed: " + p.stderr)
    got = list(csv.DictReader(io.StringIO(p.stdout)))
    want = events(o)
    key = lambda e: (e["device"], e["kind"], e["start"])
    for e in got:
        e["start"], e["end"] = epoch(e["start"]), epoch(e["end"])
    got.sort(key=key)
    want.sort(key=key)
    if [key(e) for e in got] != [key(e) for e in want]:
        gk, wk = set(map(key, got)), set(map(key, want))
        print(label, "events only in cw-thermal:", sorted(gk - wk)[:5])
        print(label, "events only in the reference:", sorted(wk - gk)[:5])
        sys.exit(label + ": %d events, reference %d" %
                 (len(got), len(want)))
    for g, w in zip(got, want):
        d = "%s %s %s %d" % (label, g["device"], g["kind"], g["start"])
        if g["zone"] != w["zone"]:
            same(d + " zone", 0, 1)
        same(d + " end", g["end"], w["end"])
        for c in ("duration_s", "temp_min_c", "temp_max_c", "charge_ah",
                  "soc_start_pct", "soc_end_pct"):
            same(d + " " + c, num(g[c]), w[c])
    kinds = {(e["kind"], e["zone"]) for e in want}
    print(label, "ok:", len(got), "events,", len(kinds), "kind/zone pairs")
    if len(got) < 50:
        sys.exit(label + ": too few events for a meaningful check")

base = dict(lim=(0, 10, 45, 60), use=(-20, 60), hyst=0.5, merge=120,
            min_dur=60, max_gap=900, min_i=0.05)
check("defaults", [], base)
check("no hysteresis, merge or minimum",
      ["--hysteresis", "0", "--merge", "0", "--min-duration", "0"],
      dict(base, hyst=0, merge=0, min_dur=0))
check("wide", ["--hysteresis", "2", "--merge", "10m", "--min-duration",
               "5m", "--max-gap", "5m", "--min-current", "0.5",
               "--limits", "-2,8,40,50", "--use-limits", "-5,40"],
      dict(base, hyst=2, merge=600, min_dur=300, max_gap=300, min_i=0.5,
           lim=(-2, 8, 40, 50), use=(-5, 40)))
if bad:
    sys.exit("%d mismatches" % bad)
PY
