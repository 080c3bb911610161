#!/bin/sh
# cw-clean --step against numpy.interp (Debian python3-numpy, called
# through /usr/bin/python3) on small irregular logs.
#   Voltage, temperature, SoC at each grid point: numpy.interp of the
#   rows, linear between the rows around the point.
#   Current at grid point g: the charge over (g - step, g] of the stream's
#   piecewise-constant current (each row's current holds over the
#   interval ending at it, lib/charge.h), i.e. the difference of the
#   cumulative charge Q, which is linear between rows, so numpy.interp
#   of Q at min(g, t_last) and max(g - step, t0), divided by the step.
#   Grid: every multiple of the step since the epoch from the one at or
#   before the first row to the one at or after the last row of each run;
#   runs split at intervals over --max-gap (15 min here), which
#   numpy.interp would bridge and cw-clean must not.
# Three invented devices: one of 40 rows 3..40 s apart, one with a
# 20-minute gap, one whose SoC is missing on some rows (an empty
# neighbour makes the grid value empty), for steps 60, 45 and 7 s.
# Tolerance 1e-9 relative (cw-clean writes 10 significant digits).
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import csv, math, random, subprocess, sys
import numpy as np

tmp = sys.argv[1]
rng = random.Random(1049)
T0 = 1772323200.0            # 2026-03-01T00:00:00Z, on every grid
MAX_GAP = 900.0

# Times are kept as whole milliseconds, and computed in seconds since T0:
# as epoch seconds in a double (an ulp of 2.4e-7 s) the reference itself
# would be off by more than the tolerance.
def device(name, n, gap_at=None, soc_holes=False):
    t = rng.uniform(0, 50)
    rows = []
    for k in range(n):
        if gap_at is not None and k == gap_at:
            t += 1200.0
        v = 3.6 + 0.4 * math.sin(k / 7.0) + rng.uniform(-0.01, 0.01)
        i = rng.choice([-8, -3.5, -1, 0, 0.5, 2, 4]) + rng.uniform(-0.2, 0.2)
        temp = 15 + 10 * math.cos(k / 11.0)
        soc = 50 + 40 * math.sin(k / 13.0)
        if soc_holes and rng.random() < 0.2:
            soc = None
        rows.append((name, round(t * 1000) / 1000, v, i, temp, soc))
        t += rng.uniform(3, 40)
    return rows

logs = device('A', 40) + device('B', 40, gap_at=22) + \
    device('C', 40, soc_holes=True)
path = tmp + '/log.csv'
with open(path, 'w', newline='') as f:
    w = csv.writer(f, lineterminator='\n')
    w.writerow(['device', 'time', 'voltage_v', 'current_a', 'temp_c',
                'soc_pct'])
    for r in logs:
        ms = round(T0 * 1000) + round(r[1] * 1000)
        w.writerow([r[0], '%d.%03d' % divmod(ms, 1000), repr(r[2]),
                    repr(r[3]), repr(r[4]),
                    '' if r[5] is None else repr(r[5])])

def iso_to_rel(s):
    # Seconds since T0 of an output time, exactly, by datetime.
    from datetime import datetime, timezone
    d = datetime.fromisoformat(s) - datetime.fromtimestamp(T0, timezone.utc)
    return d.days * 86400 + d.seconds + d.microseconds / 1e6

def close(a, b):
    return math.isclose(a, b, rel_tol=1e-9, abs_tol=1e-9)

fails = 0
for step in (60, 45, 7):
    p = subprocess.run(['cw-clean', '--step', str(step), path],
                       capture_output=True, text=True)
    if p.returncode != 0:
        sys.exit('cw-clean exit %d: %s' % (p.returncode, p.stderr))
    out = {}
    for r in csv.DictReader(p.stdout.splitlines()):
        out.setdefault(r['device'], []).append(r)
    checked = bad = 0
    for name in 'ABC':
        rows = [r for r in logs if r[0] == name]
        # Runs split at gaps longer than MAX_GAP.
        runs, cur = [], [rows[0]]
        for a, b in zip(rows, rows[1:]):
            if b[1] - a[1] > MAX_GAP:
                runs.append(cur)
                cur = []
            cur.append(b)
        runs.append(cur)
        want = []
        for run in runs:
            t = np.array([r[1] for r in run])
            v = np.array([r[2] for r in run])
            i = np.array([r[3] for r in run])
            tc = np.array([r[4] for r in run])
            soc = np.array([np.nan if r[5] is None else r[5] for r in run])
            # Cumulative charge in A*s; the first row carries none.
            q = np.concatenate(([0.0], np.cumsum(i[1:] * np.diff(t))))
            # The grid is of multiples of the step since the epoch; T0 is
            # off it by T0 mod step (T0 is whole seconds).
            off = int(T0) % step
            # A run is framed by the grid points at or before its first
            # row and at or after its last, which hold the end rows'
            # values (numpy.interp clamps to them outside the run).
            g0 = math.floor((t[0] + off) / step) * step - off
            g1 = math.ceil((t[-1] + off) / step) * step - off
            g = np.arange(g0, g1 + 1e-9, step)
            for gk in g:
                lo = max(gk - step, t[0])
                hi = min(gk, t[-1])
                # Current: the charge of (gk - step, gk] over the step; the
                # first point takes the first row's own.
                cur_i = i[0] if gk == g0 else \
                    (np.interp(hi, t, q) - np.interp(lo, t, q)) / step
                # SoC: numpy.interp over the two rows around gk; empty when
                # either is, unless gk is on a row or outside the run.
                k = int(np.searchsorted(t, gk))
                if gk <= t[0]:
                    s = soc[0]
                elif gk >= t[-1]:
                    s = soc[-1]
                elif t[k] == gk:
                    s = soc[k]
                else:
                    s = np.interp(gk, t[k - 1:k + 1], soc[k - 1:k + 1])
                want.append((gk, np.interp(gk, t, v), cur_i,
                             np.interp(gk, t, tc), s))
        got = out.get(name, [])
        if len(got) != len(want):
            print('  step %d %s: %d grid rows, numpy expects %d' %
                  (step, name, len(got), len(want)))
            bad += 1
            continue
        for r, (gk, v, i, tc, s) in zip(got, want):
            checked += 1
            errs = []
            if not close(iso_to_rel(r['time']), gk):
                errs.append('time %s, expected %.3f' % (r['time'], gk))
            for col, x in (('voltage_v', v), ('current_a', i),
                           ('temp_c', tc), ('soc_pct', s)):
                if np.isnan(x):
                    if r[col] != '':
                        errs.append('%s %s, expected empty' % (col, r[col]))
                elif r[col] == '' or not close(float(r[col]), x):
                    errs.append('%s %s, expected %.12g' % (col, r[col], x))
            if errs:
                bad += 1
                if bad <= 5:
                    print('  step %d %s %s: %s' % (step, name, r['time'],
                                                  '; '.join(errs)))
    print('step %2d: %d grid rows checked, %d differ' % (step, checked, bad))
    fails += bad
print('%d differences' % fails)
sys.exit(1 if fails else 0)
PY
