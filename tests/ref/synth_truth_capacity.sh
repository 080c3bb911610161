#!/bin/sh
# cw-capacity against the capacity cw-synth injected (truth-devices.csv:
# capacity_start_ah and capacity_end_ah, the true capacity at the first
# and the last sample; swings_20, how often the true SoC swung 20 points
# between turning points), four spring weeks of 12 packs with no faults,
# cleaned at the native 10 s rate, default gates, --rated 14.  A seed
# (7) and season other than those the tool was tried on while written.
#
# cw-synth's gauge counts over the true capacity as it fades, with a gain
# error of up to 1.5 % (so charge over SoC change is the capacity over
# 1 + gain), an offset, a drift of up to 0.8 points a day between
# full-charge resets, and whole-percent or tenth steps.  The truth's
# capacity at a time is taken as linear between its start and end
# (calendar and cycle fade at a steady pace; the truth has no more).
# Checks:
#  - recall: every pack whose true SoC swung 20 points at least 5 times
#    gets a trend (5 estimates, the default --min-estimates);
#  - for those: capacity_start_ah within 2 % of the truth at the first
#    estimate, and fade_pct_per_30d within 25 % (or 0.4 points) of the
#    truth's mean rate over the run (the issue's tolerances);
#  - precision: a pack whose true SoC never swung 20 points has no
#    estimate at all; every estimate lies within 4 % of the truth at its
#    time (the 1.5 % gain, the drift, a step row's charge: 3.4 % seen at
#    most while writing, on another seed);
#  - eol_date only where Sen's interval lies below zero, and never in a
#    control run with --aging 0 (no fade at all in the truth): no pack
#    then gets an eol_date, and Sen's interval holds zero for every
#    fitted pack but at most one (a 95 % interval misses by chance one
#    time in 20; with four or five fitted packs one miss or more happens
#    about one time in five, two or more one time in fifty);
#  - --ocv with cw-synth's own OCV curve (testdata/ocv-synth.csv, from
#    the formula of cw-synth(1)) on the first run, as if the gauge had
#    no SoC: the same accuracy checks for every pack with a trend, no
#    estimate without a swing, and a trend for every deep-depot pack (the
#    ones that rest: parked overnight at the depot on 0.01 to 0.03 A; the
#    docked ones draw 0.08 to 0.25 A on the dock, and a draw above
#    --min-current is no rest);
#  - all of the above again with cw-synth's default faults (gaps, clock
#    jumps, duplicates, late and stale rows, sentinels, cut lines; cw-clean
#    mends or drops what it can, its warnings are not the point here).
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
for run in 1:none 0:none 1:default; do
	a=${run%%:*} f=${run#*:}
	d=$tmp/a$a$f
	cw-synth -n 12 -d 28 -S 2026-04-06 -s 7 -F $f --aging $a -o "$d"
	cw-clean --charge-negative --cells 10 -o "$d/s.csv" "$d"/*.a.csv.gz \
	    2>/dev/null
	cw-capacity -o "$d/est.csv" "$d/s.csv"
	cw-capacity -t --rated 14 -o "$d/trend.csv" "$d/s.csv"
done
d=$tmp/a1none
O="--ocv testdata/ocv-synth.csv --cells 10"
cw-capacity $O -o "$d/ocv-est.csv" "$d/s.csv"
cw-capacity $O -t --rated 14 -o "$d/ocv-trend.csv" "$d/s.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import csv, datetime, os, sys
fails = []
def check(ok, what):
    if not ok:
        fails.append(what)
def t(s):
    return datetime.datetime.fromisoformat(s.replace('Z', '+00:00')).timestamp()
def load(path):
    return list(csv.DictReader(open(path)))
for run in ('1none', '0none', '1default'):
    a = run[0]
    d = os.path.join(sys.argv[1], 'a' + run)
    truth = {r['device']: r for r in load(os.path.join(d, 'truth-devices.csv'))}
    trend = {r['device']: r for r in load(os.path.join(d, 'trend.csv'))}
    def cap_at(dv, when):
        x = truth[dv]
        c0, c1 = float(x['capacity_start_ah']), float(x['capacity_end_ah'])
        t0, t1 = t(x['first']), t(x['last'])
        return c0 + (c1 - c0) * (when - t0) / (t1 - t0)
    n, worst, within2 = 0, 0.0, 0
    per = {}
    for r in load(os.path.join(d, 'est.csv')):
        dv = r['device']
        per[dv] = per.get(dv, 0) + 1
        when = (t(r['start']) + t(r['end'])) / 2
        err = 100 * (float(r['capacity_ah']) / cap_at(dv, when) - 1)
        n += 1
        worst = max(worst, abs(err))
        within2 += abs(err) <= 2
        check(abs(err) <= 4, '%s %s: estimate %s at %s off by %.2f %%'
              % (run, dv, r['capacity_ah'], r['start'], err))
    print('aging %s: %d estimates, %d within 2 %%, worst %.2f %%'
          % (run, n, within2, worst))
    fitted = holds = 0
    for dv, x in sorted(truth.items()):
        r = trend[dv]
        sw = int(x['swings_20'])
        tag = 'aging %s %s (%s, %d swings)' % (run, dv, x['profile'], sw)
        if sw == 0:
            check(per.get(dv, 0) == 0, '%s: %d estimates without a swing'
                  % (tag, per.get(dv, 0)))
        if r['eol_date'] != '':
            check(float(r['slope_hi_ah_per_day']) < 0, '%s: eol with an '
                  'interval up to %s' % (tag, r['slope_hi_ah_per_day']))
            check(a == '1', '%s: eol %s with no fade' % (tag, r['eol_date']))
        if r['slope_lo_ah_per_day'] != '':
            fitted += 1
            holds += float(r['slope_lo_ah_per_day']) <= 0 <= \
                float(r['slope_hi_ah_per_day'])
        if sw < 5:
            continue
        check(r['capacity_start_ah'] != '', '%s: no trend (%s estimates)'
              % (tag, r['estimates']))
        if r['capacity_start_ah'] == '':
            continue
        c0 = cap_at(dv, t(r['first']))
        got = float(r['capacity_start_ah'])
        e0 = 100 * (got / c0 - 1)
        check(abs(e0) <= 2, '%s: capacity_start %.4f, truth %.4f' %
              (tag, got, c0))
        days = (t(x['last']) - t(x['first'])) / 86400
        want = float(x['fade_pct']) / days * 30
        fr = float(r['fade_pct_per_30d'])
        check(abs(fr - want) <= max(0.25 * want, 0.4), '%s: fade per 30 d '
              '%.3f, truth %.3f' % (tag, fr, want))
        print('%s: start %.3f Ah (truth %.3f, %+.2f %%), fade per 30 d '
              '%.2f %% (truth %.2f %%), eol %s' % (tag, got, c0, e0, fr,
              want, r['eol_date'] or '-'))
    if a == '0':
        check(holds >= fitted - 1, 'aging 0: zero '
              'inside the interval for %d of %d fitted packs'
              % (holds, fitted))
        print('aging 0: zero inside the interval for %d of %d fitted packs'
              % (holds, fitted))
# The rest-voltage variant on the first run: no gauge SoC at all.
d = os.path.join(sys.argv[1], 'a1none')
truth = {r['device']: r for r in load(os.path.join(d, 'truth-devices.csv'))}
trend = {r['device']: r for r in load(os.path.join(d, 'ocv-trend.csv'))}
def cap_at(dv, when):
    x = truth[dv]
    c0, c1 = float(x['capacity_start_ah']), float(x['capacity_end_ah'])
    t0, t1 = t(x['first']), t(x['last'])
    return c0 + (c1 - c0) * (when - t0) / (t1 - t0)
n, worst, per = 0, 0.0, {}
for r in load(os.path.join(d, 'ocv-est.csv')):
    dv = r['device']
    per[dv] = per.get(dv, 0) + 1
    err = 100 * (float(r['capacity_ah']) /
                 cap_at(dv, (t(r['start']) + t(r['end'])) / 2) - 1)
    n += 1
    worst = max(worst, abs(err))
    check(abs(err) <= 4, 'ocv %s: estimate %s at %s off by %.2f %%'
          % (dv, r['capacity_ah'], r['start'], err))
print('ocv: %d estimates, worst %.2f %%' % (n, worst))
for dv, x in sorted(truth.items()):
    r = trend[dv]
    tag = 'ocv %s (%s, %s swings)' % (dv, x['profile'], x['swings_20'])
    if x['swings_20'] == '0':
        check(per.get(dv, 0) == 0, '%s: estimates without a swing' % tag)
    if x['profile'] == 'deep-depot':
        check(r['capacity_start_ah'] != '', '%s: no trend' % tag)
    if r['capacity_start_ah'] == '':
        continue
    c0 = cap_at(dv, t(r['first']))
    got = float(r['capacity_start_ah'])
    check(abs(got / c0 - 1) <= 0.02, '%s: capacity_start %.4f, truth %.4f'
          % (tag, got, c0))
    days = (t(x['last']) - t(x['first'])) / 86400
    want = float(x['fade_pct']) / days * 30
    fr = float(r['fade_pct_per_30d'])
    check(abs(fr - want) <= max(0.25 * want, 0.4), '%s: fade per 30 d '
          '%.3f, truth %.3f' % (tag, fr, want))
    print('%s: start %.3f Ah (truth %.3f, %+.2f %%), fade per 30 d %.2f %% '
          '(truth %.2f %%)' % (tag, got, c0, 100 * (got / c0 - 1), fr, want))
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
