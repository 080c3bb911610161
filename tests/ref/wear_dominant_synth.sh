#!/bin/sh
# cw-wear's shares and dominant cause on invented fleets (cw-synth),
# judged against what cw-synth injected (truth-devices.csv, the profile
# of each pack; truth-charging.csv, its charge by JEITA zone from the
# true current and temperature), with precision counted as well as
# recall.
#
# 1. The demo fleet, as scripts/demo.sh makes it (24 packs, 28 winter
#    days from 2026-01-12, seed 1, the default faults, cw-clean and
#    cw-wear with the demo's options): on every row the four shares add
#    up to 1, to 1e-9 plus the rounding of the printed values (10
#    significant digits: 5e-10 of each share's size); SPEC.md's rule.
# 2. Fleets built per stressor, 24 packs for 14 days in winter
#    (2026-01-12) and in summer (2026-07-13), seed 5, no faults,
#    --cycle-life 500 as the demo.  What each pack was built for (the
#    scenario's intent, not a quantity the model was tuned on):
#      - cold-charge: the truth's charge below T1 = 0 C (below-min) is
#        at least 1 % of its charge (SPEC.md's rule applied to the
#        truth), whatever the profile;
#      - deep-depot packs, cycled deep daily and stored indoors: cycling;
#      - idle-dock packs, held full in a dock: high-soc, or in summer
#        heat (they sit near full in the sun);
#      - topup-dock and topup-nocutoff packs (short hops, docked between)
#        have no single intended cause: listed, not scored.
#    Asserted: cold-charge exactly for the packs the truth's rule names
#    (cw-wear with T1 moved 0.5 K either way brackets the gauge's 0.1 K
#    noise and 0.05 K offset: with T1 at -0.5 C no pack the truth does
#    not name, with T1 at +0.5 C every pack it names), and in summer
#    every scored pack as built.  Printed: the confusion of intent and
#    verdict per season, the precision of each verdict and the recall of
#    each intent over both seasons, and the idle-dock packs' share of
#    time at 95 % SoC or more.  In winter the idle-dock packs may come
#    out cycling: the cold slows their calendar aging, and with it the
#    cost of being full, more than their rides (cw-wear(1), Dominant);
#    that is counted against precision, not hidden.  The same tables are
#    printed for the published constants (no --cycle-life: about 2790
#    full cycles to 20 % fade instead of 500, so cycling weighs less).
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
W="--cycle-life 500"
cw-synth -n 24 -d 28 -S 2026-01-12 -s 1 -o "$tmp/demo"
cw-clean --charge-negative --cells 10 --bounds current=-30:30 \
    -o "$tmp/demo.csv" "$tmp/demo"/*.a.csv.gz
cw-wear $W --capacity 14 -o "$tmp/demo-wear.csv" "$tmp/demo.csv"
for season in 2026-01-12 2026-07-13; do
	d=$tmp/$season
	cw-synth -n 24 -d 14 -S $season -s 5 -F none -o "$d"
	cw-clean --charge-negative --cells 10 -o "$d/s.csv" "$d"/*.a.csv.gz
	cw-wear $W -o "$d/wear.csv" "$d/s.csv"
	cw-wear -o "$d/pub.csv" "$d/s.csv"
	cw-wear $W --limits -0.5,10,45,60 -o "$d/lo.csv" "$d/s.csv"
	cw-wear $W --limits 0.5,10,45,60 -o "$d/hi.csv" "$d/s.csv"
done
/usr/bin/python3 - "$tmp" <<'PY'
import csv, os, sys
from collections import defaultdict
tmp = sys.argv[1]
fails = []
def load(path):
    return {r['device']: r for r in csv.DictReader(open(path))}

# 1. Shares add up to 1 on every row of the demo fleet.
S = ('share_age', 'share_cycling', 'share_high_soc', 'share_heat')
rows = list(csv.DictReader(open(os.path.join(tmp, 'demo-wear.csv'))))
worst = 0.0
for r in rows:
    v = [float(r[k]) for k in S]
    err = abs(sum(v) - 1)
    worst = max(worst, err)
    if err > 1e-9 + sum(5e-10 * abs(x) for x in v):
        fails.append('demo %s: shares add up to %.12g' % (r['device'], sum(v)))
print('demo fleet: %d rows, shares add up to 1 within %.2g' % (len(rows), worst))
if len(rows) != 24:
    fails.append('demo fleet: %d rows, not 24' % len(rows))

# 2. Dominant against intent.
# Per rating: (intent, verdict) -> packs; verdict -> [right, all];
# intent -> [right, all], over both seasons.
conf = {k: defaultdict(int) for k in ('rated 500', 'published')}
pred = {k: defaultdict(lambda: [0, 0]) for k in conf}
rec = {k: defaultdict(lambda: [0, 0]) for k in conf}
for season in ('2026-01-12', '2026-07-13'):
    d = os.path.join(tmp, season)
    truth = load(os.path.join(d, 'truth-devices.csv'))
    wear, lo, hi, pub = (load(os.path.join(d, n)) for n in
                         ('wear.csv', 'lo.csv', 'hi.csv', 'pub.csv'))
    below = defaultdict(float)
    for r in csv.DictReader(open(os.path.join(d, 'truth-charging.csv'))):
        if r['kind'] == 'charge' and r['zone'] == 'below-min':
            below[r['device']] += float(r['charge_ah'])
    summer = season == '2026-07-13'
    print('%s:' % season)
    for dv in sorted(truth):
        x, w = truth[dv], wear[dv]
        cold = float(x['charge_ah']) > 0 and \
            below[dv] >= 0.01 * float(x['charge_ah'])
        if lo[dv]['dominant'] == 'cold-charge' and not cold:
            fails.append('%s %s: cold-charge with T1 at -0.5 C, truth '
                         'below 0 C %.2f of %s Ah' % (season, dv, below[dv],
                         x['charge_ah']))
        if cold and hi[dv]['dominant'] != 'cold-charge':
            fails.append('%s %s: truth cold-charge (%.2f Ah below 0 C), '
                         'with T1 at +0.5 C %s' % (season, dv, below[dv],
                         hi[dv]['dominant']))
        p = x['profile']
        if cold:
            intent, ok = 'cold-charge', ('cold-charge',)
        elif p == 'deep-depot':
            intent, ok = 'cycling', ('cycling',)
        elif p == 'idle-dock':
            intent = 'held-full'
            ok = ('high-soc', 'heat') if summer else ('high-soc',)
        else:
            intent, ok = None, ()
        v = w['dominant']
        full = float(w['hours_near_full']) / (24 * float(w['days']))
        print('  %s %-14s %-11s -> %-11s (published: %-11s) shares age %.3f '
              'cyc %.3f soc %.3f heat %.3f, near full %.0f %%' % (dv, p,
              intent or '-', v, pub[dv]['dominant'], float(w['share_age']),
              float(w['share_cycling']), float(w['share_high_soc']),
              float(w['share_heat']), 100 * full))
        if intent is None:
            continue
        for k, vv in (('rated 500', v), ('published', pub[dv]['dominant'])):
            conf[k][(intent, vv)] += 1
            pred[k][vv][0] += vv in ok
            pred[k][vv][1] += 1
            rec[k][intent][0] += vv in ok
            rec[k][intent][1] += 1
        good = v in ok
        if summer and not good:
            fails.append('%s %s (%s): dominant %s, built for %s' % (
                season, dv, p, v, '/'.join(ok)))
for k in conf:
    print('%s: intent -> verdict, packs (both seasons):' % k)
    for (i, v), n in sorted(conf[k].items()):
        print('  %-11s -> %-11s %d' % (i, v, n))
    for v, (g, n) in sorted(pred[k].items()):
        print('  precision of %-11s %d/%d = %.2f' % (v, g, n, g / n))
    for i, (g, n) in sorted(rec[k].items()):
        print('  recall of %-11s %d/%d = %.2f' % (i, g, n, g / n))
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
