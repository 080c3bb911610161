#!/bin/sh
# cw-volt and cw-thermal's charge protocol against the incidents cw-synth
# injected (--incidents 2: two packs each of a 10 A dock charger without
# the JEITA rules in the cold, a charger without them in a 50 C cabinet,
# a pack stored flat past its cut-off, a depot charger at 4.30 V per
# cell): a winter and a summer week of 16 packs with no faults, cleaned by
# cw-clean at the native 10 s rate, and the truth files truth-volt.csv
# and truth-charging.csv (cw-synth(1)).
#
# The truth applies each tool's rules to the true values, without
# hysteresis.  The tools see the gauge: 4 mV of noise on the pack voltage
# (0.4 mV per cell of the 10), 8 mA on the current, 0.1 K on the
# temperature on a grid offset by 0.05 K (cw-synth's gauge), and cw-volt
# ends an event only --hysteresis (0.02 V) back inside, cw-thermal only
# 0.5 K back inside.  The thresholds below follow from that:
#  - cw-volt, recall: every truth event is matched by a tool event of the
#    same device, limit and kind that overlaps it; its start and end lie
#    within one sample (10 s) of the truth's, or else every reading in
#    the span between them lies within 2 mV per cell (5 sigma of the
#    noise) of the limit (a slow drift across it, read early or late), or,
#    for an end that comes later, within the hysteresis band plus those
#    2 mV (the tool holding the event until the reading is 0.02 V back);
#  - cw-volt, spurious: a tool event matched by no truth event is a
#    boundary event when its extreme reading is within 2 mV of the limit;
#    none may be other than that;
#  - cw-volt --summary: per pack as many over and under events as the
#    truth, plus its boundary events; the extreme cell voltage of a pack
#    with events within 2.5 mV of the truth's (the extreme of 10^5 noisy
#    readings of a plateau is up to some 4.5 sigma, 1.8 mV, off); a pack
#    without events never read beyond a limit by more than 2 mV;
#    ah_charged_over within 1 % plus 0.04 Ah per event (one 10 s sample
#    of the 14 A depot charger) of the truth's charge of its over-charge
#    events;
#  - cw-thermal, recall: every truth charge event outside the protocol
#    (over-current in the cool zone, over-voltage in the warm zone,
#    no-charge-allowed below T1 or above T4) overlaps a tool charge event
#    with the same protocol word; how many of them also start and end
#    within a sample is printed (placement near a threshold is the matter
#    of synth_truth_thermal.sh);
#  - cw-thermal's verdicts: each follows from its zone, i_max_a and
#    v_cell_max by the rules above (a hand derivation of cw-thermal(1));
#  - cw-thermal, spurious: a tool event outside the protocol matched by no
#    truth event with the same word is a boundary event when the reading
#    that gives its word is within the gauge's error of the rule: its zone
#    reached by at most 0.5 K (4.5 sigma plus the 0.05 K offset, as in
#    synth_truth_thermal.sh), or i_max_a above the reduced current plus
#    its 5 % margin by at most 0.05 A (6 sigma), or v_cell_max above the
#    reduced voltage plus its 0.02 V by at most 2.5 mV; none may be other
#    than that, and boundary events are at most 15 % of the tool's events
#    outside the protocol (a bound chosen here, common practice, no source: the
#    summer week's dock chargers charging at 4.20 V at a true 44.9 C,
#    read as 45.1 C, give about 9 %; the verdict is then judged on the
#    reading, which is all the tool has);
#  - cw-thermal --summary: its counts per verdict are those of its events.
# The reduced current and voltage are cw-thermal(1)'s defaults (0.5 C of
# the 14 Ah, 4.10 V per cell), from memory of the JEITA guideline; the
# cell maker's data sheet rules for real packs.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
for season in 2026-01-12 2026-07-13; do
	d=$tmp/$season
	cw-synth -n 16 -d 7 -S $season -s 17 -F none --incidents 2 -o "$d"
	cw-clean --charge-negative --cells 10 -o "$d/s.csv" "$d"/*.a.csv.gz
	cw-volt --cells 10 -o "$d/volt.csv" "$d/s.csv"
	cw-volt --cells 10 --summary -o "$d/volt-sum.csv" "$d/s.csv"
	cw-thermal --capacity 14 --cells 10 -o "$d/th.csv" "$d/s.csv"
	cw-thermal --capacity 14 --cells 10 --summary -o "$d/th-sum.csv" \
	    "$d/s.csv"
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
def events(path, pred=lambda r: True):
    by = defaultdict(list)
    for r in csv.DictReader(open(path)):
        if pred(r):
            r['s'], r['e'] = t(r['start']), t(r['end'])
            by[r['device']].append(r)
    return by
def rows_of(path):
    by = defaultdict(list)
    for r in csv.DictReader(open(path)):
        v = float(r['voltage_v']) / 10 if r['voltage_v'] else None
        tc = float(r['temp_c']) if r['temp_c'] else None
        by[r['device']].append((t(r['time']), v, tc))
    return by
def span(rows, a, b):
    """The readings of the rows in (a, b]."""
    i = bisect.bisect_right(rows, (a, float('inf')))
    j = bisect.bisect_right(rows, (b, float('inf')))
    return rows[i:j]
def overlap(x, r):
    return x['s'] < r['e'] and x['e'] > r['s']
VMAX, VMIN, HYST, VTOL = 4.25, 2.50, 0.02, 0.002
T1, T2, T3, T4 = 0.0, 10.0, 45.0, 60.0
I_COOL = 0.5 * 14 * 1.05
V_WARM = 4.10 + 0.02
total = Counter()
for season in ('2026-01-12', '2026-07-13'):
    d = os.path.join(sys.argv[1], season)
    rows = rows_of(os.path.join(d, 's.csv'))
    # cw-volt.
    tv = events(os.path.join(d, 'truth-volt.csv'))
    vv = events(os.path.join(d, 'volt.csv'))
    matched, exact, n, nfound = set(), 0, 0, 0
    for dev, evs in tv.items():
        for r in evs:
            n += 1
            c = [x for x in vv[dev] if x['limit'] == r['limit'] and
                 x['kind'] == r['kind'] and overlap(x, r)]
            what = '%s %s %s %s %s' % (season, dev, r['kind'], r['limit'],
                                       r['start'])
            check(c, what + ': truth event missed')
            if not c:
                continue
            nfound += 1
            x = min(c, key=lambda x: abs(x['s'] - r['s']))
            matched.add(id(x))
            lim = VMAX if r['limit'] == 'over' else VMIN
            near = lambda v: abs(v - lim) <= VTOL
            if r['limit'] == 'over':
                held = lambda v: v >= lim - HYST - VTOL
            else:
                held = lambda v: v <= lim + HYST + VTOL
            ok_s = abs(x['s'] - r['s']) <= 10 or all(
                near(v) for _, v, _ in
                span(rows[dev], min(x['s'], r['s']), max(x['s'], r['s'])))
            if abs(x['e'] - r['e']) <= 10:
                ok_e = True
            elif x['e'] > r['e']:
                ok_e = all(held(v) for _, v, _ in
                           span(rows[dev], r['e'], x['e']))
            else:
                ok_e = all(near(v) for _, v, _ in
                           span(rows[dev], x['e'], r['e']))
            check(ok_s, what + ': start %+d s, not explained by the '
                  'readings' % (x['s'] - r['s']))
            check(ok_e, what + ': end %+d s, not explained by the '
                  'readings' % (x['e'] - r['e']))
            exact += abs(x['s'] - r['s']) <= 10 and abs(x['e'] - r['e']) <= 10
    boundary = extra = 0
    nb = Counter()
    for dev, evs in vv.items():
        for x in evs:
            if id(x) in matched or any(
                    r['limit'] == x['limit'] and r['kind'] == x['kind'] and
                    overlap(x, r) for r in tv[dev]):
                continue
            if x['limit'] == 'over':
                b = float(x['v_cell_max']) <= VMAX + VTOL
            else:
                b = float(x['v_cell_min']) >= VMIN - VTOL
            boundary += b
            extra += not b
            nb[dev, x['limit']] += 1
            check(b, '%s %s %s %s %s: spurious cw-volt event' % (
                season, dev, x['kind'], x['limit'], x['start']))
    kinds = Counter((r['limit'], r['kind']) for v in tv.values() for r in v)
    print('%s cw-volt: %d truth events %s; %d found, %d within a sample; '
          'spurious: %d boundary, %d other' % (season, n, dict(kinds),
          nfound, exact, boundary, extra))
    check(kinds[('over', 'charge')] > 0 and kinds[('over', 'rest')] > 0 and
          kinds[('under', 'rest')] > 0, '%s: truth-volt.csv lacks a kind: %s'
          % (season, dict(kinds)))
    total['volt'] += n
    # cw-volt --summary.
    for s in csv.DictReader(open(os.path.join(d, 'volt-sum.csv'))):
        dev, what = s['device'], '%s %s summary' % (season, s['device'])
        ev = tv.get(dev, [])
        over = [r for r in ev if r['limit'] == 'over']
        under = [r for r in ev if r['limit'] == 'under']
        check(int(s['events_over']) == len(over) + nb[dev, 'over'] and
              int(s['events_under']) == len(under) + nb[dev, 'under'],
              what + ': %s over, %s under events, truth %d, %d, boundary '
              '%d, %d' % (s['events_over'], s['events_under'], len(over),
              len(under), nb[dev, 'over'], nb[dev, 'under']))
        vmax, vmin = float(s['v_cell_max']), float(s['v_cell_min'])
        if over:
            tmax = max(float(r['v_cell_max']) for r in over)
            check(abs(vmax - tmax) <= 0.0025, what + ': v_cell_max %g, '
                  'truth %g' % (vmax, tmax))
            q = sum(float(r['charge_ah']) for r in over
                    if r['kind'] == 'charge')
            nq = sum(1 for r in over if r['kind'] == 'charge')
            got = float(s['ah_charged_over'])
            check(abs(got - q) <= 0.01 * q + 0.04 * nq, what +
                  ': ah_charged_over %g, truth %g' % (got, q))
        else:
            check(vmax <= VMAX + VTOL, what + ': v_cell_max %g' % vmax)
        if under:
            tmin = min(float(r['v_cell_min']) for r in under)
            check(abs(vmin - tmin) <= 0.0025, what + ': v_cell_min %g, '
                  'truth %g' % (vmin, tmin))
        else:
            check(vmin >= VMIN - VTOL, what + ': v_cell_min %g' % vmin)
    # cw-thermal's protocol.
    charge = lambda r: r['kind'] == 'charge'
    tc = events(os.path.join(d, 'truth-charging.csv'), charge)
    tt = events(os.path.join(d, 'th.csv'), charge)
    found, placed, want = Counter(), Counter(), Counter()
    for dev, evs in tc.items():
        for r in evs:
            p = r['protocol']
            if p == 'within':
                continue
            want[p] += 1
            c = [x for x in tt[dev] if overlap(x, r) and x['protocol'] == p]
            check(c, '%s %s %s %s %s: truth event outside the protocol '
                  'missed' % (season, dev, r['zone'], p, r['start']))
            if c:
                found[p] += 1
                placed[p] += any(abs(x['s'] - r['s']) <= 10 and
                                 abs(x['e'] - r['e']) <= 10 for x in c)
    outside = boundary = extra = 0
    for dev, evs in tt.items():
        for x in evs:
            p = x['protocol']
            z = x['zone']
            if z in ('below-min', 'above-max'):
                q = 'no-charge-allowed'
            elif z == 'cool':
                q = ('over-current' if float(x['i_max_a']) > I_COOL
                     else 'within')
            elif z == 'warm':
                q = ('over-voltage' if float(x['v_cell_max']) > V_WARM
                     else 'within')
            else:
                q = 'within'
            check(p == q, '%s %s %s: %s %s with %s A, %s V is %s by the '
                  'rules' % (season, dev, x['start'], z, p, x['i_max_a'],
                             x['v_cell_max'], q))
            if p in ('within', 'unknown'):
                continue
            outside += 1
            if any(overlap(x, r) and r['protocol'] == p for r in tc[dev]):
                continue
            lo, hi = float(x['temp_min_c']), float(x['temp_max_c'])
            b = ((z == 'below-min' and lo >= T1 - 0.5) or
                 (z == 'cool' and lo >= T2 - 0.5) or
                 (z == 'warm' and hi <= T3 + 0.5) or
                 (z == 'above-max' and hi <= T4 + 0.5) or
                 (p == 'over-current' and
                  I_COOL < float(x['i_max_a']) <= I_COOL + 0.05) or
                 (p == 'over-voltage' and
                  V_WARM < float(x['v_cell_max']) <= V_WARM + 0.0025))
            boundary += b
            extra += not b
            check(b, '%s %s %s %s %s: spurious protocol verdict (%g..%g C, '
                  '%s A, %s V)' % (season, dev, z, p, x['start'], lo, hi,
                  x['i_max_a'], x['v_cell_max']))
    check(boundary <= 0.15 * outside, '%s: %d of %d tool events outside '
          'the protocol are boundary events' % (season, boundary, outside))
    print('%s cw-thermal: truth outside the protocol %s; found %s, within '
          'a sample %s; tool events outside it %d, spurious: %d boundary, '
          '%d other' % (season, dict(want), dict(found), dict(placed),
          outside, boundary, extra))
    for p in want:
        total[p] += want[p]
    # cw-thermal --summary against its own events.
    per = defaultdict(Counter)
    for dev, evs in tt.items():
        for x in evs:
            per[dev][x['protocol']] += 1
    for s in csv.DictReader(open(os.path.join(d, 'th-sum.csv'))):
        got = {p: int(s['events_' + p.replace('-', '_')]) for p in
               ('within', 'over-current', 'over-voltage',
                'no-charge-allowed')}
        got['unknown'] = int(s['events_unknown_protocol'])
        check(all(got[p] == per[s['device']][p] for p in got),
              '%s %s: summary counts %s, events %s' % (
                  season, s['device'], got, dict(per[s['device']])))
# Both weeks together must have given every verdict to find.
check(total['over-current'] > 0 and total['over-voltage'] > 0 and
      total['no-charge-allowed'] > 0, 'verdicts in the truth: %s' %
      dict(total))
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
