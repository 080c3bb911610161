#!/bin/sh
# cw-rainflow over long random histories against an independent Python
# reference (Debian's /usr/bin/python3 with numpy), written separately from
# lib/rainflow.c and by another method:
#   turning points: numpy (np.diff signs) after merging flat runs; with a
#   hysteresis, a threshold walk over whole numbers (the data are in
#   thousandths, so every comparison is exact);
#   counting: the four-point method (an inner range closes as a full cycle
#   when it is not larger than both ranges beside it; what is left, the
#   residue, counts as half cycles), which gives the same counts as the
#   three-point rule of ASTM E1049-85 (reapproved 2017) section 5.4.4 with
#   its step 6 (the standard's own Fig. 6 example is in
#   tests/unit/test_rainflow.c and tests/cli/cw-rainflow/astm-fig6.sh);
#   also the three-point rule exactly as section 5.4.4 writes it (step 5
#   half cycles at the starting point), for the counts by range and mean;
#   --residue repeat: the history taken as periodic (turning points
#   rotated to start and end at the maximum), every range closed by the
#   four-point method; --residue full: the residue counted as full cycles.
# Checked per device: every row (range, mean, count, start, end) for the
# default residue, the total count and the count-weighted range sum for
# all three modes, and the summary's cycles, efc, max_range and mean_range.
# Devices are interleaved, and the stream is split into a gzipped and a
# plain file, so cycles spanning the two files are counted once.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import gzip, os, subprocess, sys
from datetime import datetime, timezone
import numpy as np

tmp = sys.argv[1]
rng = np.random.default_rng(20260314)
T0 = 1767225600

# Values in thousandths of a percent, as whole numbers.
def walk(n):		# a bounded random walk with flats and long swings
    x = np.empty(n, dtype=np.int64)
    v = 50000
    for k in range(n):
        if rng.random() < 0.05:
            pass				# a flat sample
        else:
            v += int(rng.normal(0, 1500))
        v = min(max(v, 0), 100000)
        x[k] = v
    return x

devs = {
    "W1": walk(30000),
    "W2": walk(30000),
    "U3": rng.integers(0, 101, 30000) * 1000,	# whole percents: many ties
    "S4": (np.round(50000 + 45000 * np.sin(np.arange(30000) / 37.0)
           + rng.normal(0, 800, 30000))).astype(np.int64),
}
times = {d: T0 + 60 * np.arange(len(x)) + 17 * i
         for i, (d, x) in enumerate(devs.items())}

# Interleave the devices at random, keeping each device's order.
order = np.concatenate([np.full(len(x), i) for i, x in enumerate(devs.values())])
rng.shuffle(order)
names = list(devs)
pos = [0] * len(names)
rows = []
for i in order:
    d = names[i]
    k = pos[i]
    pos[i] += 1
    rows.append("%s,%d,%d.%03d,25\n" % (d, times[d][k], devs[d][k] // 1000,
                                       devs[d][k] % 1000))
half = len(rows) // 2
hdr = "device,time,soc_pct,temp_c\n"
with gzip.open(os.path.join(tmp, "a.csv.gz"), "wt") as f:
    f.write(hdr + "".join(rows[:half]))
with open(os.path.join(tmp, "b.csv"), "w") as f:
    f.write(hdr + "".join(rows[half:]))

def turning(x, t, h):
    """Turning points (value, time) with hysteresis h (whole numbers)."""
    # Merge flat runs: keep the first sample of each run.
    keep = np.concatenate(([True], np.diff(x) != 0))
    x, t = x[keep], t[keep]
    if h <= 1:				# no reversal is below one unit
        if len(x) < 2:
            return []
        d = np.sign(np.diff(x))
        ext = np.concatenate(([True], d[1:] != d[:-1], [True]))
        return list(zip(x[ext].tolist(), t[ext].tolist()))
    # Threshold walk: wait for a first move of h, then follow the extreme.
    out = []
    lo = hi = 0
    k = 1
    while k < len(x):
        if x[k] - x[lo] >= h:
            out.append(lo); up = True; break
        if x[hi] - x[k] >= h:
            out.append(hi); up = False; break
        if x[k] < x[lo]: lo = k
        if x[k] > x[hi]: hi = k
        k += 1
    else:
        return []
    ext = k
    for j in range(k + 1, len(x)):
        if (x[j] > x[ext]) if up else (x[j] < x[ext]):
            ext = j
        elif abs(x[j] - x[ext]) >= h:
            out.append(ext); ext = j; up = not up
    out.append(ext)
    return [(int(x[i]), int(t[i])) for i in out]

def fourpoint(tp, periodic=False):
    """Four-point rainflow; returns (full cycles, residue points)."""
    full, st = [], []
    for p in tp:
        st.append(p)
        while len(st) >= 4:
            a, b, c, d = st[-4:]
            inner = abs(b[0] - c[0])
            if inner <= abs(a[0] - b[0]) and inner <= abs(c[0] - d[0]):
                full.append((b, c))
                del st[-3:-1]
            else:
                break
    return full, st

def astm3(tp):
    """ASTM E1049-85 5.4.4 as written: the three-point rule with the
    starting point S, half cycles at S (step 5), the residue as halves."""
    rows, st, s = [], [], 0
    for p in tp:
        st.append(p)
        while len(st) - s >= 3:
            a, b, c = st[-3:]
            y, x = abs(a[0] - b[0]), abs(b[0] - c[0])
            if x < y:
                break
            if len(st) - 3 == s:
                rows.append(row(a, b, 0.5))
                s += 1
            else:
                rows.append(row(a, b, 1.0))
                del st[-3:-1]
    rows += [row(st[i], st[i + 1], 0.5) for i in range(s, len(st) - 1)]
    return rows

def by_range_mean(rows):
    out = {}
    for r in rows:
        out[(r[0], r[1])] = out.get((r[0], r[1]), 0.0) + r[2]
    return out

def row(a, b, count):
    t0, t1 = sorted((a[1], b[1]))
    return (abs(a[0] - b[0]), a[0] + b[0], count, t0, t1)  # mean * 2

def reference(tp, mode):
    full, res = fourpoint(tp)
    rows = [row(a, b, 1.0) for a, b in full]
    if mode == "half" or mode == "full":
        c = 0.5 if mode == "half" else 1.0
        rows += [row(res[i], res[i + 1], c) for i in range(len(res) - 1)]
    else:
        # The residue as one period: rotate to the maximum, close it there,
        # merge the joint (flat or same direction), count it all.
        if len(res) >= 2:
            m = max(range(len(res)), key=lambda i: (res[i][0], -i))
            seq = res[m:] + res[:m + 1]
            clean = []
            for p in seq:
                if clean and p[0] == clean[-1][0]:
                    continue
                if len(clean) >= 2 and (clean[-1][0] - clean[-2][0]) * \
                        (p[0] - clean[-1][0]) > 0:
                    clean[-1] = p
                    continue
                clean.append(p)
            f2, left = fourpoint(clean)
            rows += [row(a, b, 1.0) for a, b in f2]
            # Left: max, min, max; the largest range, once.
            assert len(left) == 3, left
            rows.append(row(left[0], left[1], 1.0))
    return rows

def iso(t):
    return datetime.fromtimestamp(t, timezone.utc).strftime("%Y-%m-%dT%H:%M:%SZ")

def tool(*args):
    p = subprocess.run(["cw-rainflow", *args, os.path.join(tmp, "a.csv.gz"),
                        os.path.join(tmp, "b.csv")], capture_output=True,
                       text=True)
    if p.returncode != 0 or p.stderr:
        sys.exit("cw-rainflow %s: rc %d: %s" % (args, p.returncode, p.stderr))
    lines = p.stdout.splitlines()
    return lines[0], [l.split(",") for l in lines[1:]]

fails = 0
def check(what, ok):
    global fails
    if not ok:
        fails += 1
        print("FAIL", what)

for h in (1, 2000, 7500):		# thousandths: 0.001, 2 and 7.5 percent
    hs = "%g" % (h / 1000.0)
    for mode in ("half", "full", "repeat"):
        hdr_, out = tool("--hysteresis", hs, "--residue", mode)
        check("header", hdr_ == "device,range,mean,count,start,end,temp_c")
        for d in names:
            tp = turning(devs[d], times[d], h)
            want = reference(tp, mode)
            got = [r for r in out if r[0] == d]
            wc = sum(r[2] for r in want)
            gc = sum(float(r[3]) for r in got)
            wr = sum(r[2] * r[0] for r in want) / 1000.0
            gr = sum(float(r[3]) * float(r[1]) for r in got)
            check("%s h=%s %s: count %g vs %g" % (d, hs, mode, gc, wc),
                  abs(gc - wc) < 1e-9)
            check("%s h=%s %s: range sum %.10g vs %.10g" % (d, hs, mode, gr,
                  wr), abs(gr - wr) <= 1e-9 * max(1.0, wr))
            # Half cycles are (turning points - 1) / 2 in all, by definition.
            if mode == "half":
                check("%s h=%s: (tp-1)/2" % (d, hs),
                      abs(gc - (len(tp) - 1) / 2.0) < 1e-9)
            if mode == "repeat":
                check("%s h=%s: repeat closes everything" % (d, hs),
                      all(r[3] == "1" for r in got))
            if mode != "half":
                continue
            # Counts by (range, mean) equal those of the standard as
            # written, ties (U3) included.
            g = {}
            for r in got:
                k = (round(float(r[1]) * 1000), round(float(r[2]) * 2000))
                g[k] = g.get(k, 0.0) + float(r[3])
            a = by_range_mean(astm3(tp))
            check("%s h=%s: counts by range and mean vs ASTM as written"
                  % (d, hs), g == a)
            # Row by row: range, mean, count, start, end.
            wset = sorted(("%.3f" % (r[0] / 1000.0), "%.4f" % (r[1] / 2000.0),
                           "%g" % r[2], iso(r[3]), iso(r[4])) for r in want)
            gset = sorted(("%.3f" % float(r[1]), "%.4f" % float(r[2]), r[3],
                           r[4], r[5]) for r in got)
            check("%s h=%s: %d rows vs %d, first difference %s" % (d, hs,
                  len(gset), len(wset), next((a, b) for a, b in
                  zip(gset + [None], wset + [None]) if a != b)
                  if gset != wset else None), gset == wset)
    # The summary against the same reference.
    hdr_, out = tool("--hysteresis", hs, "--summary")
    check("summary header", hdr_.startswith(
        "device,cycles,efc,max_range,mean_range"))
    check("summary devices", [r[0] for r in out] == sorted(names))
    for r in out:
        want = reference(turning(devs[r[0]], times[r[0]], h), "half")
        c = sum(w[2] for w in want)
        rs = sum(w[2] * w[0] for w in want) / 1000.0
        mx = max(w[0] for w in want) / 1000.0
        got = [float(v) for v in r[1:5]]
        exp = [c, rs / 100.0, mx, rs / c]
        check("summary %s: %s vs %s" % (r[0], got, exp),
              all(abs(g - e) <= 1e-8 * max(1.0, abs(e))
                  for g, e in zip(got, exp)))
    print("h=%s: %d devices checked" % (hs, len(names)))

if fails:
    sys.exit("%d checks failed" % fails)
print("rainflow reference: all checks passed")
PY
