#!/bin/sh
# cw-topoff tells top-offs from rides, against the truth cw-synth injected
# (truth-topoff.csv: each re-start of a dock charger after it terminated
# with no ride since; truth-rides.csv: every ride, with the true SoC at
# its start and its lowest), a week of 16 packs with no faults, cleaned at
# the native 10 s rate.  Few short rides stay above 95 % (a ride takes 1
# to 20 % of a 14 Ah pack), so the band is --full 85, where a third of
# the invented fleet's rides start and end inside it; the standby level
# is the default 0.5 A (the simulated docks draw 0.08 to 0.25 A, parked
# packs 0.01 to 0.03 A; rides 1.2 A and more, with pauses at 0 A).
#
# The gauge differs from the true SoC (gain error up to 1.5 %, capacity
# 4 % below to 3 % above the 14 Ah it counts with, re-anchored at each
# termination), so truth events are taken with a margin:
#  - use-dip recall: every ride taken from a charger and ended on one,
#    whose true SoC stayed 1.5 points or more above the band, at least
#    1.5 points deep, and that the next ride of the pack (there must be
#    one) starts 30 min or more after it with the SoC back up by half the
#    drop or more (so the recharge that ends the dip happened in the hold)
#    lies in a tool use dip: one that starts before the ride ends and
#    ends (the last row of its recharge) no earlier than the ride's end
#    - 20 s (it may start after the ride did: a whole-percent gauge holds
#    its 99 for the ride's first minutes, and the peak is its last row
#    there): at least 95 %;
#  - use-dip precision: every tool use dip overlaps a truth ride of its
#    pack: at least 95 %;
#  - top-off recall: every completed truth micro-cycle 1 to 4 % deep is a
#    tool top-off ending within 30 s of the truth's end: at least 95 %;
#  - top-off precision: every tool top-off that ends after the pack's
#    first termination holds a truth re-start and overlaps no ride: at
#    least 95 % (a top-off over a ride is a ride counted as a top-off,
#    the fault this check is for).
# The 95 % floors are this check's choice (issue 18), not a standard.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 16 -d 7 -s 5 -F none -o "$tmp/in"
cw-clean --charge-negative --cells 10 -o "$tmp/s.csv" "$tmp"/in/*.a.csv.gz
cw-topoff -e --use-dips --full 85 -o "$tmp/tool.csv" "$tmp/s.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import datetime, os, sys
import csv
from collections import defaultdict
d = sys.argv[1]
def t(s):
    return datetime.datetime.fromisoformat(s.replace('Z', '+00:00')).timestamp()
FULL, MARGIN = 85.0, 1.5
rides = defaultdict(list)
for r in csv.DictReader(open(os.path.join(d, 'in', 'truth-rides.csv'))):
    r['s'], r['e'] = t(r['start']), t(r['end'])
    r['a'], r['m'] = float(r['soc_start_pct']), float(r['soc_min_pct'])
    rides[r['device']].append(r)
truth = list(csv.DictReader(open(os.path.join(d, 'in', 'truth-topoff.csv'))))
first = {}
for r in truth:
    first[r['device']] = min(first.get(r['device'], 1e18), t(r['start']))
restarts = defaultdict(list)
for r in truth:
    restarts[r['device']].append(t(r['restart']))
top, use = defaultdict(list), defaultdict(list)
for r in csv.DictReader(open(os.path.join(d, 'tool.csv'))):
    r['s'], r['e'] = t(r['start']), t(r['end'])
    (use if r['kind'] == 'use' else top)[r['device']].append(r)

fails = []
def floor(name, hit, n, need=50):
    if n < need:
        fails.append('%s: only %d cases' % (name, n))
    elif hit < 0.95 * n:
        fails.append('%s: %d of %d' % (name, hit, n))
    print('%-20s %d of %d = %.1f %%' % (name, hit, n,
          100.0 * hit / n if n else 0))

# Use-dip recall.
n = hit = 0
for dv, rl in rides.items():
    rl.sort(key=lambda r: r['s'])
    for k, r in enumerate(rl[:-1]):
        nx = rl[k + 1]
        if not (r['from_charger'] == '1' and r['to_charger'] == '1' and
                r['m'] >= FULL + MARGIN and r['a'] - r['m'] >= MARGIN and
                nx['s'] - r['e'] >= 1800 and
                nx['a'] >= r['m'] + (r['a'] - r['m']) / 2):
            continue
        n += 1
        hit += any(x['s'] <= r['e'] and x['e'] >= r['e'] - 20
                   for x in use[dv])
floor('use-dip recall', hit, n)
# Use-dip precision.
n = hit = 0
for dv, xl in use.items():
    for x in xl:
        n += 1
        hit += any(r['s'] <= x['e'] and r['e'] >= x['s'] for r in rides[dv])
floor('use-dip precision', hit, n)
# Top-off recall.
n = hit = 0
for r in truth:
    depth = float(r['depth_pct'])
    if r['completed'] != '1' or not 1.0 <= depth <= 4.0:
        continue
    n += 1
    hit += any(abs(x['e'] - t(r['end'])) <= 30 for x in top[r['device']])
floor('top-off recall', hit, n)
# Top-off precision.
n = hit = over = 0
for dv, xl in top.items():
    for x in xl:
        if x['e'] <= first.get(dv, 1e18):
            continue
        n += 1
        ride = any(r['s'] <= x['e'] and r['e'] >= x['s'] for r in rides[dv])
        over += ride
        hit += (not ride and
                any(x['s'] <= q <= x['e'] for q in restarts[dv]))
floor('top-off precision', hit, n)
print('tool top-offs over a ride: %d' % over)
for f in fails:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
