#!/bin/sh
# cw-synth's faults as cw-clean sees them, with the column lines
# cw-synth(1) documents for each format.  The expectation is what the
# faults are by definition, not what cw-clean happens to do: a duplicate
# repeats a sample already seen; a truncated line lacks fields; a sentinel
# is outside any plausible value; a row later than the 60 s reorder
# window, or stamped by a clock set back, comes out of order; a row late
# by less is put back; a repeated header is skipped.  So, line by line,
# cw-clean's rejects must be exactly truth-faults.csv's dup (duplicate),
# trunc (malformed), sentinel (out-of-range), stale and jump
# (out-of-order) rows, and both formats must clean to the same stream.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 5 -d 2 -s 3 -f both -o "$tmp/f" \
    -F default,dup=0.002,late=0.002,stale=0.001,trunc=0.001,sentinel=0.002,gap=1,jump=1,header=2
cw-clean -c 'time=ts_ms:ms,device=dev_id,voltage=pack_mv:mV,current=pack_ma:mA,temp=temp_dk:dK,soc=soc_pct:pct' \
    --charge-negative --cells 10 --bounds current=-30:30 \
    --rejects "$tmp/rej-a.csv" -o "$tmp/a.csv" "$tmp"/f/*.a.csv.gz
cw-clean -c 'time=local_time:iso,device=pack_id,voltage=volts:V,current=amps:A,temp=temp_f:F,soc=soc:pct' \
    -d ';' --decimal-comma --cells 10 --bounds current=-30:30 \
    --rejects "$tmp/rej-b.csv" -o "$tmp/b.csv" "$tmp"/f/*.b.csv.gz
cmp "$tmp/a.csv" "$tmp/b.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import csv, os, sys
t = sys.argv[1]
reason = {'dup': 'duplicate', 'trunc': 'malformed', 'sentinel':
          'out-of-range', 'stale': 'out-of-order', 'jump': 'out-of-order'}
want, seen = set(), set()
for r in csv.DictReader(open(os.path.join(t, 'f', 'truth-faults.csv'))):
    if r['fault'] in reason:
        want.add((r['day'], int(r['line']), reason[r['fault']]))
    seen.add(r['fault'])
bad = 0
for fmt in 'ab':
    got = set()
    for r in csv.DictReader(open(os.path.join(t, 'rej-' + fmt + '.csv'))):
        got.add((os.path.basename(r['source'])[:10], int(r['line']),
                 r['reason']))
    if got != want:
        bad += 1
        print(fmt, 'only rejected:', sorted(got - want)[:5],
              'only in truth:', sorted(want - got)[:5])
    print(fmt, len(got), 'rejects', len(want), 'expected')
missing = (set(reason) | {'late', 'header'}) - seen
if missing:
    print('no fault of kind', missing)
    bad += 1
rows = sum(1 for _ in open(os.path.join(t, 'a.csv'))) - 1
devs = list(csv.DictReader(open(os.path.join(t, 'f', 'truth-devices.csv'))))
lines = sum(int(d['lines']) for d in devs)
if rows != lines - len(want):
    print('rows out', rows, 'lines', lines, 'rejects', len(want))
    bad += 1
sys.exit(1 if bad else 0)
PY
