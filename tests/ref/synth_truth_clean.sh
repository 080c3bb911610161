#!/bin/sh
# cw-clean against the truth cw-synth injected (truth-devices.csv,
# truth-days.csv), on a fleet with every fault kind at raised rates:
#  - each injected fault is rejected, or passed, as cw-clean(1) says it
#    should be, one for one, in both raw formats: a truncated line is
#    malformed; a sentinel (the gauge's no-value code in one field) is
#    out-of-range; a duplicated row is a duplicate; a row late by up to
#    60 s is put back in order (the reorder window is 60 s, inclusive)
#    and passed; a stale row (the first period past 60 s to 10 min late:
#    70 s at this 10 s period) and every row written while the
#    clock was set back are out-of-order; a repeated header is skipped and
#    counted apart; a gap rejects nothing.  So the -v counts by reason
#    equal the truth's counts, and the rejects file holds exactly the
#    lines truth-faults.csv lists (file and line), each with the reason
#    its fault calls for (tolerance 0: every fault is counted, none is
#    guessed).  Late and stale rows meet at the window's edge, so a
#    window of 50 s or of 70 s instead of 60 fails this check (make
#    mutate shows it);
#  - data lines = accepted + rejected, and accepted = rows sampled - gap
#    rows - trunc - sentinel - stale - jump rows (truth-devices.csv);
#  - format a (epoch ms, mV, mA charging negative, 0.1 K, commas) and
#    format b (local time with offset, V, A, degrees F, semicolons and
#    decimal commas) clean to the same sample stream, byte for byte: both
#    carry mV and mA exactly, and F = dK * 0.18 - 459.67 has two decimals,
#    so (F - 32) * 5/9 = dK / 10 - 273.15 exactly (SI Brochure, 9th ed.,
#    for the kelvin and Celsius; the Fahrenheit relation from NIST SP 811
#    appendix B.8), within the 10 significant digits the stream keeps;
#  - the current sentinel of format a, -32768 mA, would read as +32.768 A
#    after --charge-negative, inside the default current bounds of
#    cw-clean (-1000..1000 A); cw-clean's default --sentinel list rejects
#    it by its raw value, and with --sentinel none it passes, so the a
#    stream then has exactly that many rows more than the b stream (b
#    writes -32768 A, out of range).  The byte-for-byte comparison of the
#    two formats runs with --sentinel none, since a genuine reading of
#    exactly 65535 mV or -32768 mA in format a is a sentinel by its raw
#    value while the same reading in format b (V, A) is not.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
F=default,dup=0.002,late=0.001,stale=0.0005,trunc=0.0005
F=$F,sentinel=0.001,gap=1,jump=0.5,header=2
cw-synth -n 8 -d 3 -s 21 -f both -F "$F" -o "$tmp/in"
A="--charge-negative --cells 10"
B="-d ; --decimal-comma --cells 10"
cw-clean -v $A --bounds current=-30:30 --sentinel none --rejects "$tmp/ra.csv" \
    "$tmp"/in/*.a.csv.gz >"$tmp/a.csv" 2>"$tmp/a.log"
cw-clean -v $B --bounds current=-30:30 --sentinel none --rejects "$tmp/rb.csv" \
    "$tmp"/in/*.b.csv.gz >"$tmp/b.csv" 2>"$tmp/b.log"
cmp "$tmp/a.csv" "$tmp/b.csv"
cw-clean $A --sentinel none "$tmp"/in/*.a.csv.gz >"$tmp/a0.csv"
cw-clean $B --sentinel none "$tmp"/in/*.b.csv.gz >"$tmp/b0.csv"
cw-clean $A "$tmp"/in/*.a.csv.gz >"$tmp/a1.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import csv, os, re, sys
from collections import Counter
d = sys.argv[1]
fails = []
def check(ok, what):
    if not ok:
        fails.append(what)
devs = list(csv.DictReader(open(os.path.join(d, 'in', 'truth-devices.csv'))))
days = list(csv.DictReader(open(os.path.join(d, 'in', 'truth-days.csv'))))
tot = Counter()
for x in devs:
    for k in ('rows', 'lines', 'dup', 'late', 'stale', 'trunc', 'sentinel',
              'gap_rows', 'jump_rows'):
        tot[k] += int(x[k])
headers = sum(int(x['header_repeats']) for x in days)
want = {'malformed': tot['trunc'], 'out-of-range': tot['sentinel'],
        'duplicate': tot['dup'],
        'out-of-order': tot['stale'] + tot['jump_rows']}
for k in ('dup', 'late', 'stale', 'trunc', 'sentinel', 'jump_rows'):
    check(tot[k] > 0, 'no %s injected: the check would be empty' % k)
check(headers > 0, 'no repeated header injected')
reason = {'trunc': 'malformed', 'sentinel': 'out-of-range',
          'dup': 'duplicate', 'stale': 'out-of-order', 'jump': 'out-of-order'}
faults = list(csv.DictReader(open(os.path.join(d, 'in', 'truth-faults.csv'))))
want_l = {(r['day'], int(r['line']), reason[r['fault']]) for r in faults
          if r['fault'] in reason}
check(len(want_l) == sum(want.values()), 'truth-faults.csv and '
      'truth-devices.csv disagree')
accepted = (tot['rows'] - tot['gap_rows'] - tot['trunc'] - tot['sentinel']
            - tot['stale'] - tot['jump_rows'])
for fmt in 'ab':
    log = open(os.path.join(d, fmt + '.log')).read()
    m = re.search(r'(\d+) data lines: (\d+) accepted, (\d+) rejected '
                  r'\(([^)]*)\)', log)
    check(m is not None, fmt + ': no counts in -v output')
    if m is None:
        continue
    lines, acc, rej = int(m.group(1)), int(m.group(2)), int(m.group(3))
    got = {k: int(v) for k, v in
           (p.rsplit(' ', 1) for p in m.group(4).split(', '))}
    check(got == want, '%s: rejects by reason %s, truth %s' % (fmt, got, want))
    check(lines == tot['lines'], '%s: data lines %d, truth %d'
          % (fmt, lines, tot['lines']))
    check(lines == acc + rej, fmt + ': lines != accepted + rejected')
    check(acc == accepted, '%s: accepted %d, truth %d' % (fmt, acc, accepted))
    h = re.search(r'(\d+) repeated header lines skipped', log)
    check(h is not None and int(h.group(1)) == headers,
          '%s: header repeats %s, truth %d' % (fmt, h and h.group(1), headers))
    # The rejects file, line for line against truth-faults.csv: the same
    # (day, line) pairs, each with the reason its fault calls for.
    byr, got_l = Counter(), set()
    for r in csv.DictReader(open(os.path.join(d, 'r%s.csv' % fmt))):
        byr[r['reason']] += 1
        day = os.path.basename(r['source']).split('.')[0]
        got_l.add((day, int(r['line']), r['reason']))
    check(dict(byr) == want, '%s: rejects file %s' % (fmt, dict(byr)))
    check(got_l == want_l, '%s: rejected lines: %d not in the truth %s, '
          '%d of the truth not rejected %s' % (fmt, len(got_l - want_l),
          sorted(got_l - want_l)[:3], len(want_l - got_l),
          sorted(want_l - got_l)[:3]))
# Rows per device in the stream: every sample not lost to a fault.
rows = Counter(l.split(',', 1)[0] for l in open(os.path.join(d, 'a.csv')))
for x in devs:
    n = (int(x['rows']) - int(x['gap_rows']) - int(x['trunc']) -
         int(x['sentinel']) - int(x['stale']) - int(x['jump_rows']))
    check(rows[x['device']] == n, '%s: %d rows, truth %d'
          % (x['device'], rows[x['device']], n))
# Without the current bound: format a passes its current sentinels.
cur = sum(1 for r in faults if r['fault'] == 'sentinel' and
          r['detail'] == 'current')
check(cur > 0, 'no current sentinel injected')
a0 = sum(1 for _ in open(os.path.join(d, 'a0.csv')))
b0 = sum(1 for _ in open(os.path.join(d, 'b0.csv')))
check(a0 - b0 == cur, 'default bounds, --sentinel none: a has %d rows '
      'more than b, %d current sentinels' % (a0 - b0, cur))
# With the default --sentinel list no +32.768 A row is left in a.
a1 = [l for l in open(os.path.join(d, 'a1.csv')) if ',32.768,' in l]
check(not a1, 'default --sentinel: %d rows of +32.768 A left' % len(a1))
print('truth:', dict(tot), 'headers', headers, 'current sentinels', cur)
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
