#!/bin/sh
# cw-dcir --soc auto against the resistance growth cw-synth injected into
# packs that live near full (profile idle-dock: held full in a dock, one
# or two short rides a day), two summer weeks of 8 packs, no faults,
# --aging 10 (see synth_truth_dcir.sh for the truth's columns:
# rstep_start_ohm and rstep_end_ohm, the resistance a 10 s step shows at
# 25 C at the first and the last sample).  Checks:
#  - the default gate, 20..80 % SoC, gives a trend to at most half of the
#    8 (the issue this option is for: almost every step is near full;
#    0 of 8 with the gauge of old, 3 of 8 since cw-synth's gauge drifts
#    between resets and its packs fade, which moves some steps down into
#    the gate);
#  - --soc auto gives every pack a trend, with a soc_gate whose lower end
#    is 60 or more (near full);
#  - the truth's mean slope lies inside Sen's 95 % interval of the
#    Theil-Sen slope for at least 6 of the 8 (95 % expected; the growth is
#    not exactly linear, hot afternoons add to it in bursts);
#  - r_start_ohm is within 5 % of the truth's resistance at the first
#    step (rstep_start plus the mean slope times the time since the first
#    sample; synth_truth_dcir.sh allows 3 % over 10..90 % SoC, which one
#    pack here misses by 0.1 point: the truth is the resistance at the
#    pack's own state, the fit's first point a step near full);
#  - the growth is sure (the interval's lower end above zero), so
#    eol_date is given, and growth_lo_pct_per_30d is above zero.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 8 -d 14 -s 7 -S 2026-07-13 -F none --aging 10 --mix 0,0,1,0 \
    -o "$tmp/in"
cw-clean --charge-negative --cells 10 -o "$tmp/s.csv" "$tmp"/in/*.a.csv.gz
cw-dcir -t --min-span 5d -o "$tmp/fixed.csv" "$tmp/s.csv"
cw-dcir -t --min-span 5d --soc auto -o "$tmp/auto.csv" "$tmp/s.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import csv, datetime, os, sys
d = sys.argv[1]
fails = []
def check(ok, what):
    if not ok:
        fails.append(what)
def t(s):
    return datetime.datetime.fromisoformat(s.replace('Z', '+00:00')).timestamp()
truth = {r['device']: r for r in
         csv.DictReader(open(os.path.join(d, 'in', 'truth-devices.csv')))}
fixed = [r for r in csv.DictReader(open(os.path.join(d, 'fixed.csv')))
         if r['slope_ohm_per_day'] != '']
check(len(fixed) <= 4, '%d packs with a trend at 20..80 %%' % len(fixed))
auto = list(csv.DictReader(open(os.path.join(d, 'auto.csv'))))
check(len(auto) == 8, '%d packs' % len(auto))
inside = 0
for r in auto:
    x = truth[r['device']]
    check(x['profile'] == 'idle-dock', x['profile'])
    if r['slope_ohm_per_day'] == '':
        check(False, '%s: no trend with --soc auto' % r['device'])
        continue
    lo = int(r['soc_gate'].split('-')[0])
    check(lo >= 60, '%s: gate %s' % (r['device'], r['soc_gate']))
    r0, r1 = float(x['rstep_start_ohm']), float(x['rstep_end_ohm'])
    t0, t1 = t(x['first']), t(x['last'])
    slope = (r1 - r0) / ((t1 - t0) / 86400)
    slo, shi = float(r['slope_lo_ohm_per_day']), float(r['slope_hi_ohm_per_day'])
    inside += slo <= slope <= shi
    at_first = r0 + slope * (t(r['first']) - t0) / 86400
    check(abs(float(r['r_start_ohm']) - at_first) <= 0.05 * at_first,
          '%s: r_start %.6f, truth %.6f' % (r['device'],
          float(r['r_start_ohm']), at_first))
    check(r['eol_date'] != '' and float(r['growth_lo_pct_per_30d']) > 0,
          '%s: a sure growth without eol_date' % r['device'])
    print('%s gate %s, %s steps: growth per 30 d truth %6.2f %%, cw-dcir '
          '%6.2f %% [%s, %s]' % (r['device'], r['soc_gate'], r['steps'],
          100 * slope * 30 / r0, float(r['growth_pct_per_30d']),
          r['growth_lo_pct_per_30d'], r['growth_hi_pct_per_30d']))
check(inside >= 6, 'truth slope inside the interval for %d of 8' % inside)
print('default gate: %d of 8 with a trend; --soc auto: truth inside the '
      'interval for %d of 8' % (len(fixed), inside))
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
