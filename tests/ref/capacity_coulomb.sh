#!/bin/sh
# cw-capacity against coulomb counting done by hand in Debian's Python,
# and its trend against scipy.stats.theilslopes.
#
# The rule (handbook definition of the ampere-hour): charge is the time
# integral of the current, Q = integral of I dt.  The sample stream's
# convention (lib/charge.h, SPEC.md) takes each row's current to hold over
# the interval that ends at the row, so the integral is the rectangle sum
# Q = sum of I_k (t_k - t_(k-1)); the trapezoid rule, sum of
# (I_k + I_(k-1)) / 2 (t_k - t_(k-1)), is another reading of the same
# rows, and the check shows the tool uses the former: on these currents
# the two differ by more than 1e-6, a thousand times the agreement
# asked of the rectangle sum.  capacity = 100 |Q| / |delta SoC|,
# measured from the first to the last row at which the reported SoC
# changes (cw-capacity(1), "Where the measurement begins and ends").
#
# Invented devices (all numbers invented):
#   COUL   eight charges and discharges of a 14 Ah pack at irregular
#          intervals (4 to 40 s), varying currents (a ride's random
#          levels, a charge's constant current then a taper), a pause of
#          2 minutes at 0.02 A inside each discharge (shorter than
#          --max-rest 5m: it stays inside, its charge counts), whole-
#          percent SoC rounded from the exact rectangle integral over the
#          true capacity.  Checks: each estimate's span, SoC, charge_ah
#          and capacity_ah equal the hand sums (relative 1e-9); the true
#          14 Ah lies within resolution_pct of each estimate; the
#          trapezoid sum differs from charge_ah by more than 1e-6.
#   FADE   80 discharges over 300 days, true capacity 14.2 Ah falling
#          0.004 Ah a day, each with 0.3 % of noise, tenth-percent SoC.
#          Its estimates, worked out by hand as for COUL, go to
#          theilslopes(y, x, 0.95, method='joint') (x: days from the
#          first estimate's time, the middle of its measurement); every
#          --trend column is compared: slope and Sen's interval, the line
#          at first and last, fade_pct, fade_pct_per_30d, soh_pct at
#          --rated 14, eol_date at 80 % (datetime), relative 1e-6.
#   FEW    4 discharges: a trend row with empty estimates (--min-estimates
#          5 by default).
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import csv, io, math, subprocess, sys
from datetime import datetime, timezone, timedelta
import numpy as np
from scipy.stats import theilslopes

tmp = sys.argv[1]
rng = np.random.default_rng(1050)
T0 = 1767225600                         # 2026-01-01T00:00:00Z
fails = []
def check(ok, what):
    if not ok:
        fails.append(what)
def iso(t):
    return datetime.fromtimestamp(t, timezone.utc).strftime('%Y-%m-%dT%H:%M:%SZ')

rows = []
expect = {}                              # device -> list of hand estimates

def segment(name, t, soc, cap, kind, dec, pause):
    """Rows of one segment from time T and true SoC SOC (fraction); the
    rest row before it is its boundary.  Returns t, soc, the segment's
    rows [(t, i, shown)] with the boundary first."""
    def shown(s):
        return math.floor(s * 100 * 10 ** dec + 0.5) / 10 ** dec
    seg = [(t, 0.0, shown(soc))]
    if kind == 'discharge':
        level, n = 0.0, 0
        while soc > 0.15:
            if n % 20 == 0:
                level = float(rng.uniform(2, 9))
            n += 1
            dt = int(rng.integers(4, 41))
            i = -level
            if pause and 60 <= n < 66:
                dt, i = 20, -0.02        # 6 rows of 20 s: 2 minutes
            i = round(i, 2)              # as logged
            t += dt
            soc += i * dt / 3600 / cap
            seg.append((t, i, shown(soc)))
    else:
        while True:
            dt = int(rng.integers(4, 41))
            i = round(7.0 if soc < 0.85 else 7.0 * (1 - soc) / 0.15 + 0.2, 2)
            if soc + i * dt / 3600 / cap > 0.99:
                break
            t += dt
            soc += i * dt / 3600 / cap
            seg.append((t, i, shown(soc)))
    return t, soc, seg

def by_hand(seg):
    """The estimate of a segment by the documented rule, and the
    trapezoid charge over the same span."""
    steps = [k for k in range(1, len(seg)) if seg[k][2] != seg[k - 1][2]]
    a, b = steps[0], steps[-1]
    q = sum(seg[k][1] * (seg[k][0] - seg[k - 1][0]) for k in range(a + 1, b + 1)) / 3600
    qt = sum((seg[k][1] + seg[k - 1][1]) / 2 * (seg[k][0] - seg[k - 1][0])
             for k in range(a + 1, b + 1)) / 3600
    ds = seg[b][2] - seg[a][2]
    return dict(start=seg[a][0], end=seg[b][0], soc_from=seg[a][2],
                soc_to=seg[b][2], q=q, qt=qt, cap=100 * abs(q) / abs(ds))

def device(name, n, cap0, slope, noise, dec, both, pause, day_step):
    t, soc = T0, 0.95
    out = []
    for j in range(n):
        t = T0 + int(j * day_step * 86400) + 3600
        cap = cap0 - slope * j * day_step
        cap *= 1 + float(rng.normal(0, noise))
        for kind in (('discharge', 'charge') if both else ('discharge',)):
            if kind == 'discharge':
                soc = 0.95
            t, soc, seg = segment(name, t, soc, cap, kind, dec, pause)
            rows.extend((r[0], name, r[1], r[2]) for r in seg)
            # A rest row 10 minutes later: longer than --max-rest, so the
            # segment ends at its last row with current; the next
            # segment's boundary 10 minutes after that.
            t += 600
            rows.append((t, name, 0.0, seg[-1][2]))
            t += 600
            out.append(by_hand(seg))
    expect[name] = out

device('COUL', 4, 14.0, 0, 0, 0, True, True, 1)
device('FADE', 80, 14.2, 0.004, 0.003, 1, False, False, 300 / 80)
device('FEW', 4, 14.0, 0, 0.003, 1, False, False, 2)
rows.sort(key=lambda r: (r[0], r[1]))
path = tmp + '/log.csv'
with open(path, 'w') as f:
    f.write('device,time,voltage_v,current_a,temp_c,soc_pct\n')
    for t, name, i, s in rows:
        f.write('%s,%d,40,%.2f,25,%s\n' % (name, t, i, ('%.1f' % s).rstrip('0').rstrip('.')))

def run(*opts):
    p = subprocess.run(['cw-capacity', *opts, path], capture_output=True,
                       text=True, check=True)
    return list(csv.DictReader(io.StringIO(p.stdout)))

got = {}
for r in run():
    got.setdefault(r['device'], []).append(r)
for name, want in expect.items():
    g = got.get(name, [])
    check(len(g) == len(want), '%s: %d estimates, by hand %d' %
          (name, len(g), len(want)))
    for r, w in zip(g, want):
        tag = '%s %s' % (name, r['start'])
        check(r['start'] == iso(w['start']) and r['end'] == iso(w['end']),
              '%s: span %s..%s, by hand %s..%s' % (tag, r['start'], r['end'],
              iso(w['start']), iso(w['end'])))
        check(float(r['soc_from_pct']) == w['soc_from'] and
              float(r['soc_to_pct']) == w['soc_to'], '%s: soc' % tag)
        for k, v in (('charge_ah', w['q']), ('capacity_ah', w['cap'])):
            check(abs(float(r[k]) - v) <= 1e-9 * abs(v), '%s: %s %s, by '
                  'hand %.10g' % (tag, k, r[k], v))
        if name == 'COUL':
            res = float(r['resolution_pct'])
            err = 100 * abs(float(r['capacity_ah']) / 14.0 - 1)
            check(err <= res, '%s: %.3f %% from 14 Ah, resolution %.3f %%'
                  % (tag, err, res))
            rel = abs(w['qt'] / w['q'] - 1)
            check(rel > 1e-6, '%s: trapezoid only %.2g apart' % (tag, rel))
            print('%s %-9s charge %9.5f Ah (trapezoid %9.5f), capacity '
                  '%.4f Ah, %.3f %% from 14 (resolution %.3f %%)' % (tag,
                  r['direction'], float(r['charge_ah']), w['qt'],
                  float(r['capacity_ah']), err, res))

trend = {r['device']: r for r in run('-t', '--rated', '14')}
def near(a, b, tol=1e-6):
    return abs(a - b) <= tol * max(abs(b), 1e-12)
for name in ('FADE',):
    e = expect[name]
    tm = [(w['start'] + w['end']) / 2 for w in e]
    x = np.array([(v - tm[0]) / 86400 for v in tm])
    y = np.array([w['cap'] for w in e])
    res = theilslopes(y, x, 0.95, method='joint')
    r = trend[name]
    xl = x[-1]
    c0, c1 = res[1], res[1] + res[0] * xl
    want = dict(slope_ah_per_day=res[0], slope_lo_ah_per_day=res[2],
                slope_hi_ah_per_day=res[3], capacity_start_ah=c0,
                capacity_end_ah=c1, fade_pct=100 * (c0 - c1) / c0,
                fade_pct_per_30d=-100 * res[0] * 30 / c0,
                soh_pct=100 * c1 / 14)
    check(int(r['estimates']) == len(e), '%s: estimates' % name)
    for k, v in want.items():
        check(r[k] != '' and near(float(r[k]), v), '%s: %s %s, scipy '
              '%.10g' % (name, k, r[k], v))
    if res[3] < 0:
        days = (0.8 * 14 - res[1]) / res[0]
        eol = (datetime.fromtimestamp(tm[0], timezone.utc) +
               timedelta(days=days)).strftime('%Y-%m-%d')
    else:
        eol = ''
    check(r['eol_date'] == eol, '%s: eol %s, by hand %s' % (name,
          r['eol_date'], eol))
    print('%s: slope %s [%s, %s] Ah/d, scipy %.8g [%.8g, %.8g]; eol %s'
          % (name, r['slope_ah_per_day'], r['slope_lo_ah_per_day'],
             r['slope_hi_ah_per_day'], res[0], res[2], res[3],
             r['eol_date'] or '-'))
r = trend['FEW']
check(r['estimates'] == '4' and all(r[k] == '' for k in
      ('capacity_start_ah', 'fade_pct', 'soh_pct', 'eol_date',
       'slope_ah_per_day')), 'FEW: %s' % r)
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
