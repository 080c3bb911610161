#!/bin/sh
# cw-clean's time column against Python's datetime (Debian python3,
# /usr/bin/python3): ISO 8601 extended-form times with Z, numeric offsets
# (+hh:mm, +hhmm, +hh), a space for the T, 0 to 7 fractional digits
# (datetime keeps microseconds and drops the rest, as cw-clean does), and
# zone-less local times with --tz; epoch seconds (whole and fractional),
# milliseconds and microseconds, given with -c and found by their size.
# Expected values: datetime.fromisoformat(...).astimezone(timezone.utc)
# for ISO 8601, and datetime(1970, 1, 1, tzinfo=timezone.utc) +
# timedelta(microseconds=n) for epoch counts, n computed with Python's
# Decimal (exact).  Impossible dates (Feb 29 of 2100 and 1900, Apr 31,
# month 13, hour 24, minute 60) must be rejected as bad-time; Python's
# datetime is asked first that it rejects each of them too, and that it
# accepts the leap days of 2000 and 2024.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import csv, random, subprocess, sys
from datetime import datetime, timedelta, timezone
from decimal import Decimal

tmp = sys.argv[1]
UTC = timezone.utc
EPOCH = datetime(1970, 1, 1, tzinfo=UTC)
rng = random.Random(20260301)
fails = 0


def fmt(dt):
    """The sample stream's form: fraction only when not whole."""
    dt = dt.astimezone(UTC)
    s = dt.strftime('%Y-%m-%dT%H:%M:%S')
    if dt.microsecond:
        s += ('.%06d' % dt.microsecond).rstrip('0')
    return s + 'Z'


def run(rows, args, name):
    """Rows (device, time text); a device per row, so order is free."""
    path = '%s/%s.csv' % (tmp, name)
    with open(path, 'w', newline='') as f:
        w = csv.writer(f, lineterminator='\n')
        w.writerow(['device', 'ts', 'voltage_v', 'current_a'])
        for dev, t in rows:
            w.writerow([dev, t, '3.8', '1'])
    rej = '%s/%s.rej' % (tmp, name)
    p = subprocess.run(['cw-clean', '--max-reject', '1', '--rejects', rej,
                        '-c', 'time=ts' + args[0]] + args[1:] + [path],
                       capture_output=True, text=True)
    if p.returncode != 0:
        sys.exit('%s: cw-clean exit %d: %s' % (name, p.returncode, p.stderr))
    out = {r['device']: r['time'] for r in csv.DictReader(p.stdout.splitlines())}
    rejected = {r['record'].split(',')[0]: r['reason']
                for r in csv.DictReader(open(rej, newline=''))}
    return out, rejected


def check(name, cases, args):
    """cases: (text, expected UTC text or None for a bad time)."""
    global fails
    rows = [('D%05d' % k, c[0]) for k, c in enumerate(cases)]
    out, rejected = run(rows, args, name)
    bad = 0
    for (dev, text), (_, want) in zip(rows, cases):
        if want is None:
            got = 'rejected ' + rejected.get(dev, 'no') if dev not in out \
                else out[dev]
            ok = got == 'rejected bad-time'
        else:
            got = out.get(dev, 'rejected ' + rejected.get(dev, '?'))
            ok = got == want
        if not ok:
            bad += 1
            if bad <= 5:
                print('  %s: %r -> %s, datetime says %s' % (name, text, got,
                                                          want))
    print('%-14s %5d times, %d differ' % (name, len(cases), bad))
    fails += bad


def instant(lo=1970, hi=2099):
    a = datetime(lo, 1, 1, tzinfo=UTC)
    b = datetime(hi, 12, 31, 23, 59, 59, tzinfo=UTC)
    us = rng.randrange(int((b - a).total_seconds()) * 10**6)
    return a + timedelta(microseconds=us)


# ISO 8601 with a zone: Z or an offset, 0..7 fraction digits, T or space.
offsets = ['Z', '+00:00', '+01:00', '-05:00', '+05:30', '+0545', '-0930',
           '+14:00', '-12:00', '+02', '-03', '+1030']
cases = []
for k in range(3000):
    dt = instant()
    off = rng.choice(offsets)
    if off == 'Z':
        local = dt
    else:
        sign = -1 if off[0] == '-' else 1
        hh, mm = int(off[1:3]), int(off[-2:]) if len(off) > 3 else 0
        local = dt.astimezone(timezone(sign * timedelta(hours=hh, minutes=mm)))
    digits = rng.randrange(8)
    text = local.strftime('%Y-%m-%d') + rng.choice('T ') + \
        local.strftime('%H:%M')
    if digits > 0 or rng.random() < 0.8:
        text += local.strftime(':%S')
        if digits:
            frac = '%06d' % local.microsecond + str(rng.randrange(10))
            text += '.' + frac[:digits]
    text += off
    want = fmt(datetime.fromisoformat(text))
    cases.append((text, want))
check('iso-zone', cases, [':iso'])
check('iso-auto', cases, [''])

# Zone-less local times with --tz.
for tz in ['+05:30', '-08:00', '+13:45']:
    sign = -1 if tz[0] == '-' else 1
    zone = timezone(sign * timedelta(hours=int(tz[1:3]), minutes=int(tz[4:])))
    cases = []
    for k in range(500):
        local = instant().replace(tzinfo=None)
        text = local.strftime('%Y-%m-%dT%H:%M:%S.%f')
        want = fmt(datetime.fromisoformat(text).replace(tzinfo=zone))
        cases.append((text, want))
    check('iso-tz' + tz, cases, ['', '--tz', tz])

# Epoch counts, exact through Decimal.
def epoch_cases(unit, n, lo=1970):
    per = {'s': 10**6, 'ms': 10**3, 'us': 1}[unit]
    cases = []
    for k in range(n):
        dt = instant(lo)
        us = (dt - EPOCH) // timedelta(microseconds=1)
        if unit == 's':
            d = rng.choice([0, 0, 3, 6])
            us = us // 10**(6 - d) * 10**(6 - d)
            text = str(Decimal(us) / Decimal(10**6)) if d else str(us // 10**6)
        else:
            us = us // per * per
            text = str(us // per)
        v = Decimal(text) * per
        want = fmt(EPOCH + timedelta(microseconds=int(v)))
        cases.append((text, want))
    return cases
for unit in ['s', 'ms', 'us']:
    check('epoch-' + unit, epoch_cases(unit, 1500), [':' + unit])
# Found by size (11 digits or fewer s, up to 14 ms, more us): from 2002,
# when epoch seconds have 10 digits and milliseconds 13.
for unit in ['s', 'ms', 'us']:
    check('epoch-auto-' + unit, epoch_cases(unit, 500, 2002), [''])

# Leap days and impossible dates: datetime decides which is which.
texts = ['2000-02-29T12:00:00Z', '2024-02-29T00:00:00Z',
         '2100-02-29T00:00:00Z', '1900-02-29T00:00:00Z',
         '2023-02-29T00:00:00Z', '2026-04-31T00:00:00Z',
         '2026-13-01T00:00:00Z', '2026-00-10T00:00:00Z',
         '2026-03-00T00:00:00Z', '2026-03-01T24:00:00Z',
         '2026-03-01T12:60:00Z', '2026-12-31T23:59:59.999999Z',
         '2026-03-01T00:00:00+24:00']
cases = []
for text in texts:
    try:
        want = fmt(datetime.fromisoformat(text))
    except ValueError:
        want = None
    cases.append((text, want))
expect_bad = sum(1 for _, w in cases if w is None)
if expect_bad != 10:
    sys.exit('datetime rejected %d of the dates, not the 10 expected'
             % expect_bad)
check('calendar', cases, [':iso'])

print('%d differences' % fails)
sys.exit(1 if fails else 0)
PY
