#!/bin/sh
# cw-synth's logs make physical sense and agree with the truth it writes,
# checked in Debian's Python from the raw files alone (gzip, csv):
#  - limits: 3.0..4.2 V per cell times 10 cells (the usual NMC window,
#    from memory of cell datasheets, no single source) widened by 20 mV
#    (5 sigma of the 4 mV voltage noise cw-synth(1) documents); |I| at
#    most the 14 A depot charger (1 C) and the 13.6 A riding peak, plus
#    noise; SoC 0..100, whole numbers on "int" gauges;
#  - charge balance (1 Ah = 1 A for 3600 s): the logged current, each row
#    standing for the interval that ends at it, integrates to the truth's
#    SoC change times the capacity, within 0.02 Ah (7 sigma of the 8 mA
#    current noise over the run);
#  - each charging event of truth-charging.csv is seen in the logs as
#    charging outside 10..45 C (the JEITA guideline's normal window, from
#    memory) for at least 90 % of its rows, with its charge within 3 % +
#    0.01 Ah; the truth is judged on the true temperature, the logs carry
#    0.1 K of noise, so a row counts as outside within 0.3 K (3 sigma) of
#    a threshold; and charging outside the window by
#    more than 0.5 K lies inside an event (95 % of such rows; runs shorter
#    than the 60 s minimum duration are not events);
#  - each completed top-off micro-cycle of truth-topoff.csv rests (no
#    charge) from termination to re-start and then takes its charge within
#    5 % + 0.01 Ah; the gauge shows its depth within 1 point + 6 %;
#  - resistance: steps of at least 2 A from a minute of rest, R = dV/dI,
#    brought to 25 C by the Arrhenius law with 30 kJ/mol (the value
#    cw-synth injects), have a median within 5 % of the truth's
#    rstep_start/rstep_end mean, for packs with at least 3 such steps;
#  - the physics does not depend on the faults or the format: the truth
#    of a faulty run equals that of a clean one, and format A's files are
#    the same whether format B is written beside them or not.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 10 -d 3 -s 5 -F none -o "$tmp/none"
cw-synth -n 10 -d 3 -s 5 -f both -o "$tmp/both"
cw-synth -n 10 -d 3 -s 5 -o "$tmp/a"
for f in "$tmp"/a/*.a.csv.gz; do
	cmp "$f" "$tmp/both/${f##*/}"
done
for f in truth-charging.csv truth-topoff.csv; do
	cmp "$tmp/none/$f" "$tmp/both/$f"
done
cut -d, -f1-30 "$tmp/none/truth-devices.csv" >"$tmp/p1"
cut -d, -f1-30 "$tmp/both/truth-devices.csv" >"$tmp/p2"
cmp "$tmp/p1" "$tmp/p2"
[ "$(wc -l <"$tmp/none/truth-faults.csv")" -eq 1 ]
/usr/bin/python3 - "$tmp/none" <<'PY'
import bisect, csv, datetime, glob, gzip, math, os, statistics, sys
from collections import defaultdict
d = sys.argv[1]
fails = []
def check(ok, what):
    if not ok:
        fails.append(what)
def ms(s):
    return int(round(datetime.datetime.fromisoformat(
        s.replace('Z', '+00:00')).timestamp() * 1000))
run = next(csv.DictReader(open(os.path.join(d, 'truth-run.csv'))))
P = int(run['period_s'])
truth = {r['device']: r for r in
         csv.DictReader(open(os.path.join(d, 'truth-devices.csv')))}
rows = defaultdict(list)     # device -> [(ms, V, A charging +, C, soc)]
for f in sorted(glob.glob(os.path.join(d, '*.a.csv.gz'))):
    lines = gzip.open(f, 'rt').read().split('\n')[:-1]
    check(len(lines) == 1 + 10 * int(run['rows_per_day']), f + ': lines')
    for r in csv.DictReader(lines):
        rows[r['dev_id']].append((int(r['ts_ms']), int(r['pack_mv']) / 1000,
            -int(r['pack_ma']) / 1000, int(r['temp_dk']) / 10 - 273.15,
            r['soc_pct']))
check(len(rows) == 10, 'devices')
for dev, rs in rows.items():
    t = truth[dev]
    v = [r[1] for r in rs]
    i = [r[2] for r in rs]
    check(29.98 <= min(v) and max(v) <= 42.02, f'{dev}: voltage {min(v)} '
          f'{max(v)}')
    check(-13.65 <= min(i) and max(i) <= 14.05, f'{dev}: current')
    check(all(-25 < r[3] < 70 for r in rs), f'{dev}: temperature')
    socs = [float(r[4]) for r in rs]
    check(0 <= min(socs) and max(socs) <= 100, f'{dev}: SoC range')
    if t['gauge'] == 'int':
        check(all('.' not in r[4] for r in rs), f'{dev}: int gauge')
    else:
        check(all(r[4].count('.') == 1 and len(r[4].split('.')[1]) == 1
                  for r in rs), f'{dev}: tenth gauge')
    check(all(b[0] - a[0] == P * 1000 for a, b in zip(rs, rs[1:])),
          f'{dev}: sample times')
    ah = sum(i) * P / 3600
    # The capacity fades (capacity_start_ah to capacity_end_ah): every
    # step's charge is its SoC change times the capacity then, so the
    # balance at the end's capacity may also miss by the throughput
    # times the fade relative to the end.
    cap = float(t['capacity_end_ah'])
    lost = (float(t['capacity_start_ah']) - cap) / cap
    dsoc = (float(t['soc_end_pct']) - float(t['soc_start_pct'])) / 100
    thru = float(t['charge_ah']) + float(t['discharge_ah'])
    check(abs(ah - dsoc * cap) < 0.02 + thru * lost,
          f'{dev}: charge balance {ah} {dsoc * cap}')
    check(abs(ah - (float(t['charge_ah']) - float(t['discharge_ah']))) <
          0.02, f'{dev}: charge in - out')

times = {dev: [r[0] for r in rs] for dev, rs in rows.items()}
def span(dev, a, b):         # rows with a < t <= b
    ts = times[dev]
    return rows[dev][bisect.bisect_right(ts, a):bisect.bisect_right(ts, b)]

ev = list(csv.DictReader(open(os.path.join(d, 'truth-charging.csv'))))
check(len(ev) > 0, 'no charging event to check')
inside = defaultdict(list)
for e in ev:
    a, b = ms(e['start']), ms(e['end'])
    inside[e['device']].append((a, b))
    rs = span(e['device'], a, b)
    out = [r for r in rs if r[2] > 0.05 and (r[3] < 10.3 or r[3] > 44.7)]
    check(len(rs) > 0 and len(out) >= 0.9 * len(rs), f'{e}: rows')
    q = sum(r[2] for r in out) * P / 3600
    check(abs(q - float(e['charge_ah'])) <= 0.03 * float(e['charge_ah']) +
          0.01, f'{e}: charge {q}')
    if e['zone'] == 'below-min':
        check(min(r[3] for r in rs) < 0.3, f'{e}: not below 0 C')
far = hit = 0
for dev, rs in rows.items():
    for r in rs:
        if r[2] > 0.05 and (r[3] < 9.5 or r[3] > 45.5):
            far += 1
            hit += any(a < r[0] <= b for a, b in inside[dev])
check(far > 0 and hit >= 0.95 * far, f'charging outside: {hit} of {far} '
      'in events')

mc = list(csv.DictReader(open(os.path.join(d, 'truth-topoff.csv'))))
done = [m for m in mc if m['completed'] == '1']
check(len(done) > 10, 'too few micro-cycles to check')
for m in done:
    dev = m['device']
    a, r0, b = ms(m['start']), ms(m['restart']), ms(m['end'])
    rest = span(dev, a, r0 - P * 1000)
    check(all(r[2] <= 0.05 for r in rest), f'{m}: charged while resting')
    q = sum(r[2] for r in span(dev, r0 - P * 1000, b) if r[2] > 0) * P / 3600
    check(abs(q - float(m['charge_ah'])) <= 0.05 * float(m['charge_ah']) +
          0.01, f'{m}: charge {q}')
    g = [float(r[4]) for r in span(dev, a - P * 1000, b)]
    depth = float(m['depth_pct'])
    check(abs((g[0] - min(g)) - depth) <= 1.0 + 0.06 * depth,
          f'{m}: gauge drop {g[0] - min(g)}')

R = 8.314462618
def arr(tc):
    return math.exp(-(30000 / R) * (1 / (tc + 273.15) - 1 / 298.15))
checked = 0
for dev, rs in rows.items():
    est = []
    for k in range(6, len(rs)):
        di = rs[k][2] - rs[k - 1][2]
        if all(abs(p[2]) < 0.3 for p in rs[k - 6:k]) and abs(di) >= 2 and \
           5 <= rs[k][3] <= 45:
            est.append((rs[k][1] - rs[k - 1][1]) / di * arr(rs[k][3]))
    t = truth[dev]
    want = (float(t['rstep_start_ohm']) + float(t['rstep_end_ohm'])) / 2
    if len(est) >= 3:
        checked += 1
        got = statistics.median(est)
        check(abs(got / want - 1) <= 0.05, f'{dev}: R {got} against {want}')
check(checked >= 3, 'too few packs with resistance steps')
print(f'{len(ev)} charging events, {len(done)} micro-cycles, {checked} '
      f'packs with resistance steps checked')
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
