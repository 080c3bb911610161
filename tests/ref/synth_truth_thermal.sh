#!/bin/sh
# cw-thermal against the charging events cw-synth injected
# (truth-charging.csv), a winter week and a summer week of 12 packs with
# no faults, cleaned by cw-clean at the native 10 s rate.
#
# The truth judges the true pack temperature with the rules of
# cw-thermal(1) (the zones of the JEITA guideline, 0/10/45/60 C, charging
# above 0.05 A, events joined across up to 2 min, at least 60 s long),
# but without hysteresis.  The tool sees the gauge's reading: 0.1 K steps
# on a grid offset by 0.05 K from whole degrees Celsius plus 0.1 K of
# noise (cw-synth's gauge), and it ends an event only 0.5 K back inside
# the window.  Near a threshold it can therefore open an event earlier,
# close it later or join two, by as long as the pack takes to drift
# through that half kelvin.  So the checks are:
#  - bracketing: run with every threshold moved 0.5 K into the normal
#    window (narrow: T1+0.5, T2+0.5, T3-0.5, T4-0.5) and without
#    hysteresis, the tool's events cover every truth event, from its start
#    to its end; run with every threshold moved 0.5 K out (wide), each
#    tool event lies within a truth event (10 s of slack, one sample).
#    0.5 K is 4.5 sigma of the noise plus the 0.05 K offset: a reading
#    beyond it is on the same side of the threshold as the true value;
#  - with the defaults, below-min events: every truth event colder than
#    T1 - 0.5 K at some point overlaps a tool below-min event, and every
#    tool below-min event colder than that overlaps a truth one; at least
#    95 % of the truth's have the same start and end (10 s, one sample),
#    and for those the charge agrees within 1 % + 0.002 Ah (the 8 mA
#    current noise), once the discharge of the rows between the parts of
#    a joined event is added back: the truth sums the charging rows, the
#    tool gives the net charge of the span (cw-thermal(1), OUTPUT);
#  - with the defaults, a tool event that no truth event overlaps is a
#    boundary event, reaching no further than 0.5 K outside the window
#    of its zone.  cw-synth's dock chargers start charging at exactly
#    10.0 C, which the gauge often reads as 9.95 C, so there are many.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
for season in 2026-01-12 2026-07-13; do
	cw-synth -n 12 -d 7 -S $season -s 17 -F none -o "$tmp/$season"
	cw-clean --charge-negative --cells 10 -o "$tmp/$season/s.csv" \
	    "$tmp/$season"/*.a.csv.gz
	cw-thermal -o "$tmp/$season/tool.csv" "$tmp/$season/s.csv"
	cw-thermal --hysteresis 0 --limits 0.5,10.5,44.5,59.5 \
	    -o "$tmp/$season/narrow.csv" "$tmp/$season/s.csv"
	cw-thermal --hysteresis 0 --limits -0.5,9.5,45.5,60.5 \
	    -o "$tmp/$season/wide.csv" "$tmp/$season/s.csv"
done
/usr/bin/python3 - "$tmp" <<'PY'
import bisect, csv, datetime, os, sys
from collections import Counter, defaultdict
fails = []
def check(ok, what):
    if not ok:
        fails.append(what)
def t(s):
    return datetime.datetime.fromisoformat(s.replace('Z', '+00:00')).timestamp()
T1, T2, T3, T4 = 0.0, 10.0, 45.0, 60.0
def events(path):
    by = defaultdict(list)
    for r in csv.DictReader(open(path)):
        if r['kind'] == 'charge':
            r['s'], r['e'] = t(r['start']), t(r['end'])
            by[r['device']].append(r)
    return by
seen = Counter()
for season in ('2026-01-12', '2026-07-13'):
    d = os.path.join(sys.argv[1], season)
    truth = events(os.path.join(d, 'truth-charging.csv'))
    tool = events(os.path.join(d, 'tool.csv'))
    narrow = events(os.path.join(d, 'narrow.csv'))
    wide = events(os.path.join(d, 'wide.csv'))
    for dev, evs in truth.items():
        for r in evs:
            seen[r['zone']] += 1
            over = [x for x in narrow[dev] if x['s'] < r['e'] and
                    x['e'] > r['s']]
            check(over and min(x['s'] for x in over) <= r['s'] and
                  max(x['e'] for x in over) >= r['e'],
                  '%s %s %s: not covered by the narrow window' %
                  (season, dev, r['start']))
    for dev, evs in wide.items():
        for x in evs:
            check(any(r['s'] - 10 <= x['s'] and x['e'] <= r['e'] + 10
                      for r in truth[dev]),
                  '%s %s %s: wide-window event outside the truth' %
                  (season, dev, x['start']))
    # The stream, for the discharge inside joined events.
    rows = defaultdict(list)
    for r in csv.DictReader(open(os.path.join(d, 's.csv'))):
        rows[r['device']].append((t(r['time']), float(r['current_a'])))
    def discharge(dev, s, e):
        v, q, prev = rows[dev], 0.0, None
        for tt, i in v[bisect.bisect_left(v, (s,)) - 1:]:
            if tt > e:
                break
            if prev is not None and tt > s and i < -0.05:
                q += i * (tt - prev) / 3600
            prev = tt
        return q
    n = exact = close = 0
    for dev, evs in truth.items():
        cold = [r for r in evs if r['zone'] == 'below-min']
        got = [x for x in tool[dev] if x['zone'] == 'below-min']
        for r in cold:
            n += 1
            check(float(r['temp_min_c']) >= T1 - 0.5 or
                  any(x['s'] < r['e'] and x['e'] > r['s'] for x in got),
                  '%s %s %s: truth below-min event missed' %
                  (season, dev, r['start']))
            same = [x for x in got if abs(x['s'] - r['s']) <= 10 and
                    abs(x['e'] - r['e']) <= 10]
            if same:
                exact += 1
                x = same[0]
                ah = float(r['charge_ah'])
                q = float(x['charge_ah']) - discharge(dev, x['s'], x['e'])
                close += abs(q - ah) <= 0.01 * ah + 0.002
        for x in got:
            check(float(x['temp_min_c']) >= T1 - 0.5 or
                  any(x['s'] < r['e'] and x['e'] > r['s'] for r in cold),
                  '%s %s %s: below-min event not in the truth' %
                  (season, dev, x['start']))
    check(exact >= 0.95 * n, '%s: %d of %d below-min events exact' %
          (season, exact, n))
    check(close == exact, '%s: %d of %d exact events with the same charge'
          % (season, close, exact))
    extra = 0
    for dev, evs in tool.items():
        for x in evs:
            if any(r['s'] < x['e'] and r['e'] > x['s'] for r in truth[dev]):
                continue
            extra += 1
            lo, hi = float(x['temp_min_c']), float(x['temp_max_c'])
            check((x['zone'] in ('cool', 'below-min') and
                   lo >= (T2 if x['zone'] == 'cool' else T1) - 0.5) or
                  (x['zone'] in ('warm', 'above-max') and
                   hi <= (T3 if x['zone'] == 'warm' else T4) + 0.5),
                  '%s %s %s: extra %s event reaches %g..%g C' %
                  (season, dev, x['start'], x['zone'], lo, hi))
    print('%s: %d truth events; below-min %d, %d exact; %d boundary events'
          % (season, sum(len(v) for v in truth.values()), n, exact, extra))
# Both seasons must have given something to compare.
check(seen['below-min'] > 0 and seen['cool'] > 0 and seen['warm'] > 0,
      'zones in the truth: %s' % dict(seen))
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
