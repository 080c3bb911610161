#!/bin/sh
# Charge conservation of cw-clean --step 60.  Reference: the sample
# stream's own convention for charge (lib/charge.h, cellwear(7)): row k
# carries I_k * (t_k - t_{k-1}), an interval longer than 15 min carries
# none; 1 Ah = 3600 A*s (SI).  Evaluated independently here with numpy
# (Debian python3-numpy through /usr/bin/python3), on the raw rows and on
# the resampled rows, per device.
#
# The log is made below by a Python generator: two invented packs over
# about 7 hours, interleaved in one file, about 5000 rows.
#   EB-7  an e-bike pack (10 cells): rest, a ride at 1..9 A with short
#         regenerative pulses, a parked spell with a 25 min logging
#         dropout, a charge at 4 A tapering off, rest, a second ride;
#         rows every 10 s, jittered by +-40 %, times to the millisecond.
#   HT-3  a handheld terminal (1 cell): 0.2..1.3 A of use, a dock charge
#         at 1.5 A tapering off; rows 5..30 s apart.
#   About 1 % of rows arrive up to 2 rows late (inside the 60 s reorder
#   window), as gateways deliver them.
# Checks, per device:
#   1. the issue's criterion: total Ah of the raw rows and of the
#      --step 60 rows agree within 0.1 % (in fact to 1e-7 Ah per 100 grid
#      rows, cw-clean writing 10 significant digits: each run is framed by
#      the grid points at or before its first row and at or after its
#      last, so no charge falls outside the grid);
#   2. no charge is moved in time: at every grid point g of a run, the
#      grid's cumulative charge equals the raw cumulative charge up to
#      min(g, last row) (numpy.interp of the raw cumulative charge, which
#      is linear between rows).
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import csv, math, random, subprocess, sys
from datetime import datetime, timezone
import numpy as np

tmp = sys.argv[1]
rng = random.Random(496185)
T0 = 1772323200000           # 2026-03-01T00:00:00Z, in ms
STEP = 60.0
MAX_GAP = 900.0

def ebike():
    """(t_s, V, I) of an e-bike pack; t in seconds since T0."""
    phases = [('rest', 20), ('ride', 90), ('rest', 10), ('gap', 25),
              ('rest', 10), ('charge', 150), ('rest', 30), ('ride', 60),
              ('rest', 15)]
    t, soc, out = rng.uniform(0, 59), 80.0, []
    for kind, minutes in phases:
        end = t + minutes * 60
        if kind == 'gap':
            t = end
            continue
        t_start = t
        while t < end:
            if kind == 'rest':
                i = rng.gauss(0, 0.02)
            elif kind == 'ride':
                i = -(5 + 3 * math.sin(t / 300) + rng.gauss(0, 1))
                if rng.random() < 0.05:
                    i = rng.uniform(0.5, 2.5)        # regenerative braking
                i = max(-9.0, min(2.5, i))
            else:
                age = t - t_start
                i = 4.0 if age < 6000 else 4.0 * math.exp(-(age - 6000) / 900)
                i += rng.gauss(0, 0.03)
            dt = 10 * rng.uniform(0.6, 1.4)
            soc = min(100.0, max(0.0, soc + i * dt / 36 / 14))
            v = 33 + 8 * soc / 100 + 0.05 * i
            out.append((round(t, 3), v, i))
            t += dt
    return out

def terminal():
    phases = [('use', 150), ('dock', 120), ('use', 150)]
    t, soc, out = rng.uniform(0, 59), 60.0, []
    for kind, minutes in phases:
        end, t_start = t + minutes * 60, t
        while t < end:
            if kind == 'use':
                i = -rng.uniform(0.2, 1.3)
            else:
                age = t - t_start
                i = 1.5 if age < 3600 else 1.5 * math.exp(-(age - 3600) / 1200)
            dt = rng.uniform(5, 30)
            soc = min(100.0, max(0.0, soc + i * dt / 36 / 3))
            v = 3.4 + 0.8 * soc / 100 + 0.05 * i
            out.append((round(t, 3), v, i))
            t += dt
    return out

devices = {'EB-7': ebike(), 'HT-3': terminal()}
# One file, rows in time order across devices, then ~1 % delivered late.
rows = sorted(((t, name, v, i) for name, rs in devices.items()
               for t, v, i in rs))
for k in range(len(rows) - 2):
    if rng.random() < 0.01:
        j = k + rng.choice([1, 2])
        rows[k], rows[j] = rows[j], rows[k]
path = tmp + '/log.csv'
with open(path, 'w', newline='') as f:
    w = csv.writer(f, lineterminator='\n')
    w.writerow(['device', 'time_ms', 'pack_v', 'current_a'])
    for t, name, v, i in rows:
        w.writerow([name, T0 + round(t * 1000), '%.3f' % v, '%.4f' % i])
print('log: %d rows' % len(rows))

p = subprocess.run(['cw-clean', '-v', '--bounds', 'voltage=2.5:45',
                    '--step', '60', path], capture_output=True, text=True)
if p.returncode != 0:
    sys.exit('cw-clean exit %d: %s' % (p.returncode, p.stderr))
print(p.stderr.strip())
if ': %d accepted, 0 rejected' % len(rows) not in p.stderr:
    sys.exit('cw-clean rejected rows of a clean log')
t_epoch0 = datetime.fromtimestamp(T0 / 1000, timezone.utc)
out = {}
for r in csv.DictReader(p.stdout.splitlines()):
    d = datetime.fromisoformat(r['time']) - t_epoch0
    out.setdefault(r['device'], []).append(
        (d.days * 86400 + d.seconds + d.microseconds / 1e6,
         float(r['current_a'])))

def charges(t, i):
    """Per-row charge in Ah by the stream's convention."""
    dt = np.diff(t)
    q = np.where((dt > 0) & (dt <= MAX_GAP), i[1:] * dt, 0.0) / 3600
    return np.concatenate(([0.0], q))

def windowed(t, q, width=300.0):
    """Net charge per window of WIDTH s (by the time a row ends)."""
    k = np.floor((t - 1e-9) / width).astype(int)
    return {w: q[k == w].sum() for w in np.unique(k)}

fails = 0
for name, raw in devices.items():
    raw.sort()
    rt = np.array([r[0] for r in raw])
    ri = np.round(np.array([r[2] for r in raw]), 4)   # as written
    rq = charges(rt, ri)
    gt = np.array([g[0] for g in out[name]])
    gi = np.array([g[1] for g in out[name]])
    gq = charges(gt, gi)
    net_raw, net_grid = rq.sum(), gq.sum()
    print('%s: %d raw rows, %d grid rows' % (name, len(rt), len(gt)))
    cuts = np.flatnonzero(np.diff(rt) > MAX_GAP) + 1
    tol = 1e-7 * max(1, len(gt) / 100)
    npts = badpts = 0
    for run in np.split(np.arange(len(rt)), cuts):
        t, q = rt[run], rq[run]
        cum = np.concatenate(([0.0], np.cumsum(q[1:])))
        inrun = (gt > t[0] - STEP) & (gt < t[-1] + STEP)
        g, gqr = gt[inrun], gq[inrun]
        raw_at = np.interp(np.minimum(g, t[-1]), t, cum)
        grid_at = np.concatenate(([0.0], np.cumsum(gqr[1:])))
        for gk, a_, b_ in zip(g, raw_at, grid_at):
            npts += 1
            if abs(a_ - b_) > tol:
                badpts += 1
                if badpts <= 3:
                    print('  at %.0f s: grid %.9f Ah, raw %.9f Ah' %
                          (gk, b_, a_))
    rel = abs(net_grid - net_raw) / abs(net_raw)
    ok1 = rel <= 1e-3 and abs(net_grid - net_raw) <= tol
    ok2 = badpts == 0 and npts > 0
    fails += (not ok1) + (not ok2)
    print('  1. net: raw %.9f Ah, --step 60 %.9f Ah, differ %.5f %% %s' %
          (net_raw, net_grid, 100 * rel, 'ok' if ok1 else 'FAIL'))
    print('  2. cumulative charge at %d grid points: %d differ %s' %
          (npts, badpts, 'ok' if ok2 else 'FAIL'))
print('%d failed' % fails)
sys.exit(1 if fails else 0)
PY
