#!/bin/sh
# cw-synth's files against its truth, counted independently in Debian's
# Python (gzip, csv and datetime only, nothing of cellwear):
#  - every fault the files hold is found from the files alone, on the line
#    truth-faults.csv names, and nothing else is found: repeated headers
#    (a line equal to the header), truncated lines (fewer fields than the
#    header), duplicates (a line equal to the one before), sentinels
#    (65535 mV, -32768 mA, 65535 dK, SoC 255), rows out of time order per
#    device, classed by how late they are: up to 60 s (late), up to 10 min
#    (stale), more (a clock set back: jump);
#  - the per-device counts of truth-devices.csv and truth-days.csv agree;
#  - every sample time of the grid is there once, except those the truth
#    says are missing: gap rows, truncated rows and rows with a jumped
#    clock; rows = devices x days x rows per day = lines - dup + gap_rows;
#  - format B carries the same values as format A line by line, by the
#    unit definitions: epoch ms against ISO 8601 local time with offset
#    (Python's datetime), mV = 1000 V, A's charge-negative mA = -1000 B's
#    A, degrees F = (dK / 10 - 273.15) * 9/5 + 32 (SI brochure), SoC equal.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 6 -d 2 -S 2026-02-27 --tz -03:30 -s 11 -f both -o "$tmp/f" \
    -F default,dup=0.003,late=0.002,stale=0.001,trunc=0.002,sentinel=0.002,gap=2,jump=1.5,header=3
/usr/bin/python3 - "$tmp/f" <<'PY'
import csv, datetime, gzip, os, sys
from collections import Counter, defaultdict
d = sys.argv[1]
fails = []
def check(ok, what):
    if not ok:
        fails.append(what)
run = next(csv.DictReader(open(os.path.join(d, 'truth-run.csv'))))
check(run['devices'] == '6' and run['days'] == '2' and
      run['start'] == '2026-02-27' and run['tz'] == '-03:30', 'truth-run')
P = int(run['period_s'])
rpd = int(run['rows_per_day'])
check(rpd * P == 86400, 'rows per day')
tz = datetime.timezone(-datetime.timedelta(hours=3, minutes=30))
HA = 'ts_ms,dev_id,pack_mv,pack_ma,temp_dk,soc_pct'
HB = 'local_time;pack_id;volts;amps;temp_f;soc'
devs = list(csv.DictReader(open(os.path.join(d, 'truth-devices.csv'))))
tdays = list(csv.DictReader(open(os.path.join(d, 'truth-days.csv'))))
truth = [r for r in csv.DictReader(open(os.path.join(d, 'truth-faults.csv')))]

found = set()            # (day, line, kind)
detail = {}              # (day, line) -> what the files say
per = defaultdict(Counter)
present = defaultdict(set)
maxt = {}
datalines = 0
for td in tdays:
    day = td['day']
    a = gzip.open(os.path.join(d, day + '.a.csv.gz'), 'rt').read().split('\n')
    b = gzip.open(os.path.join(d, day + '.b.csv.gz'), 'rt').read().split('\n')
    check(a[-1] == '' and b[-1] == '', day + ': last line not ended')
    a, b = a[:-1], b[:-1]
    check(len(a) == int(td['lines']) and len(b) == len(a), day + ': lines')
    check(a[0] == HA and b[0] == HB, day + ': header')
    prev = None
    for i in range(1, len(a)):
        ln = i + 1
        la, lb = a[i], b[i]
        if la == HA:
            check(lb == HB, f'{day}:{ln}: B header')
            found.add((day, ln, 'header'))
            prev = None
            continue
        datalines += 1
        fa, fb = la.split(','), lb.split(';')
        if len(fa) < 6:
            check(len(fb) < 6, f'{day}:{ln}: B not truncated')
            check(HA.count(',') > la.count(','), f'{day}:{ln}: delimiters')
            found.add((day, ln, 'trunc'))
            prev = la
            continue
        check(len(fa) == 6 and len(fb) == 6, f'{day}:{ln}: fields')
        dev, t = fa[1], int(fa[0])
        if la == prev:
            found.add((day, ln, 'dup'))
            per[dev]['dup'] += 1
        prev = la
        sent = [c for c, k, v in (('voltage', 2, '65535'),
                ('current', 3, '-32768'), ('temp', 4, '65535'),
                ('soc', 5, '255')) if fa[k] == v]
        if sent:
            check(len(sent) == 1, f'{day}:{ln}: sentinels')
            found.add((day, ln, 'sentinel'))
            detail[(day, ln)] = sent[0]
            per[dev]['sentinel'] += 1
        late = maxt.get(dev, t) - t
        maxt[dev] = max(maxt.get(dev, t), t)
        if late > 0:
            kind = ('late' if late <= 60000 else
                    'stale' if late <= 600000 else 'jump')
            found.add((day, ln, kind))
            detail[(day, ln)] = (late, t)
            per[dev][kind] += 1
        if late <= 600000:
            present[dev].add(t)
        # Format B, by the unit definitions.
        tb = datetime.datetime.fromisoformat(fb[0])
        check(tb.utcoffset() == tz.utcoffset(None), f'{day}:{ln}: offset')
        check(int(round(tb.timestamp() * 1000)) == t, f'{day}:{ln}: time')
        check(fb[1] == dev, f'{day}:{ln}: device')
        num = lambda s: float(s.replace(',', '.'))
        if 'voltage' in sent:
            check(fb[2] == '65535', f'{day}:{ln}: B voltage sentinel')
        else:
            check(round(num(fb[2]) * 1000) == int(fa[2]), f'{day}:{ln}: V')
        if 'current' in sent:
            check(fb[3] == '-32768', f'{day}:{ln}: B current sentinel')
        else:
            check(round(num(fb[3]) * 1000) == -int(fa[3]), f'{day}:{ln}: A')
        if 'temp' in sent:
            check(fb[4] == '-32768', f'{day}:{ln}: B temp sentinel')
        else:
            c = int(fa[4]) / 10 - 273.15
            check(abs(num(fb[4]) - (c * 9 / 5 + 32)) < 0.0051,
                  f'{day}:{ln}: F')
        if 'soc' in sent:
            check(fb[5] == '255', f'{day}:{ln}: B soc sentinel')
        else:
            check(abs(num(fb[5]) - float(fa[5])) < 1e-9, f'{day}:{ln}: SoC')

# The faults found are exactly those the truth lists, on the same lines.
want = set()
for r in truth:
    if r['fault'] == 'gap':
        check(r['line'] == '', 'gap with a line')
        continue
    want.add((r['day'], int(r['line']), r['fault']))
    k = (r['day'], int(r['line']))
    if r['fault'] == 'sentinel':
        check(detail.get(k) == r['detail'], f'{k}: sentinel column')
    if r['fault'] in ('late', 'stale', 'jump'):
        late, t = detail.get(k, (None, None))
        tt = datetime.datetime.fromisoformat(r['time'].replace('Z', '+00:00'))
        tt = int(round(tt.timestamp() * 1000))
        if r['fault'] == 'jump':
            check(t == tt + int(r['detail']) * 1000, f'{k}: jumped time')
        else:
            check(t == tt and late == int(r['detail']) * 1000, f'{k}: delay')
check(found == want, 'faults in files %d, in truth %d, only in files %s, '
      'only in truth %s' % (len(found), len(want), sorted(found - want)[:5],
      sorted(want - found)[:5]))
kinds = Counter(k for _, _, k in found)
print('found:', dict(sorted(kinds.items())),
      'gaps:', sum(1 for r in truth if r['fault'] == 'gap'))
for k in ('dup', 'late', 'stale', 'trunc', 'sentinel', 'header'):
    check(kinds[k] > 0, 'no ' + k + ' fault to check')
check(kinds['jump'] > 0, 'no jump to check')

# Per-device counts, and the grid of sample times.
check(sum(int(x['header_repeats']) for x in tdays) == kinds['header'],
      'header count')
check(sum(int(x['trunc']) for x in devs) == kinds['trunc'], 'trunc count')
rows = 0
for x in devs:
    dev = x['device']
    for k in ('dup', 'late', 'stale', 'sentinel'):
        check(int(x[k]) == per[dev][k], f'{dev}: {k}')
    check(int(x['jump_rows']) == per[dev]['jump'], f'{dev}: jump rows')
    rows += int(x['rows'])
    check(int(x['rows']) == 2 * rpd, f'{dev}: rows')
    check(int(x['lines']) == int(x['rows']) - int(x['gap_rows']) +
          int(x['dup']), f'{dev}: lines')
    phases = {t % (P * 1000) for t in present[dev]}
    check(len(phases) == 1, f'{dev}: phases {phases}')
    ph = phases.pop()
    z = datetime.datetime(2026, 2, 27, tzinfo=tz).timestamp()
    grid = {int(z * 1000) + k * P * 1000 + ph for k in range(2 * rpd)}
    check(present[dev] <= grid, f'{dev}: times off the grid')
    missing = grid - present[dev]
    check(len(missing) == int(x['gap_rows']) + int(x['trunc']) +
          int(x['jump_rows']), f'{dev}: missing {len(missing)}')
    for r in truth:
        if r['fault'] == 'gap' and r['device'] == dev:
            t0 = datetime.datetime.fromisoformat(r['time'].replace('Z',
                 '+00:00')).timestamp()
            for k in range(int(r['detail'])):
                check(int(t0 * 1000) + k * P * 1000 in missing,
                      f'{dev}: gap row present')
check(rows == 6 * 2 * rpd, 'rows = devices x days x rows per day')
check(datalines == sum(int(x['lines']) for x in devs), 'data lines')
check(datalines == rows + kinds['dup'] -
      sum(int(x['gap_rows']) for x in devs), 'lines = rows + dup - gaps')
for f in fails[:20]:
    print('FAIL', f)
print(len(fails), 'failures')
sys.exit(1 if fails else 0)
PY
