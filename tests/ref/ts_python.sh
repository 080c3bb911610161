#!/bin/sh
# lib/ts.c (ts_parse, ts_format) against outside references, through the
# driver build/tests/tsconv (tests/tools/tsconv.c):
#
# 1. Python datetime (proleptic Gregorian, ISO 8601), Debian's
#    /usr/bin/python3.  Random timestamps, years 1970-2100, in ISO 8601
#    extended form with Z, +hh:mm, -hh:mm, +hhmm, +hh or no zone (local at
#    a given offset), 'T' or a space, none or 1 to 9 fractional digits
#    (microseconds kept, further digits dropped, as datetime does), with
#    or without seconds.  Expected: datetime(y, m, d, h, mi, s, us,
#    timezone(offset)) - 1970-01-01T00:00Z, in microseconds; where
#    datetime.fromisoformat() reads the same text it must agree, which
#    checks the test's own text generation.  Random (y, m, d, h, mi, s),
#    some impossible (month 0 or 13, day 0, 31 or 32 where the month is
#    shorter, Feb 29 outside leap years, hour 24, minute 60): rejected
#    exactly when datetime() raises ValueError.  Epoch seconds (with up to
#    6 fractional digits), milliseconds (up to 3) and microseconds:
#    expected with Python's exact Fraction arithmetic.  ts_format of
#    random instants 1900-2100: datetime's fields, the fraction only when
#    not whole and without trailing zeros (cellwear(7)), 'Z'; and each text
#    read back gives the same instant.
# 2. GNU date (coreutils, `date -u -d TEXT +%s%N` and `date -u -d @S`)
#    for a handful of fixed texts and instants.
set -eu
top=$(cd "$(dirname "$0")/../.." && pwd)
tsconv=$top/build/tests/tsconv
[ -x "$tsconv" ] || { echo "ts_python: $tsconv not built"; exit 1; }
/usr/bin/python3 - "$tsconv" <<'PY'
import calendar, random, subprocess, sys
from datetime import datetime, timedelta, timezone
from fractions import Fraction

tsconv = sys.argv[1]
UTC = timezone.utc
EPOCH = datetime(1970, 1, 1, tzinfo=UTC)
US = timedelta(microseconds=1)
rng = random.Random(86012019)
fails = 0


def run(args, lines):
    p = subprocess.run([tsconv] + args, capture_output=True, text=True,
                       input=''.join(l + '\n' for l in lines))
    if p.returncode != 0:
        sys.exit('tsconv %s: exit %d: %s' % (args, p.returncode, p.stderr))
    out = p.stdout.split('\n')[:-1]
    if len(out) != len(lines):
        sys.exit('tsconv %s: %d lines for %d' % (args, len(out), len(lines)))
    return out


def compare(name, cases, args):
    """cases: (offset_s, text, expected microseconds or None)."""
    global fails
    out = run(args, ['%d\t%s' % (o, t) for o, t, _ in cases])
    bad = 0
    for (o, text, want), got in zip(cases, out):
        w = 'ERR' if want is None else str(want)
        if got != w:
            bad += 1
            if bad <= 5:
                print('  %s: %r (offset %d) -> %s, Python says %s'
                      % (name, text, o, got, w))
    print('%-12s %6d cases, %d differ' % (name, len(cases), bad))
    fails += bad


def zone_text(off):
    """A random spelling of OFF seconds east of UTC."""
    sign = '-' if off < 0 else '+'
    h, m = divmod(abs(off) // 60, 60)
    form = rng.randrange(3) if m == 0 else rng.randrange(2)
    if off == 0 and rng.random() < 0.5:
        return 'Z'
    return [sign + '%02d:%02d' % (h, m), sign + '%02d%02d' % (h, m),
            sign + '%02d' % h][form]


# ISO 8601, valid dates.
cases = []
checked = 0
for k in range(40000):
    y = rng.randint(1970, 2100)
    mo = rng.randint(1, 12)
    d = rng.randint(1, calendar.monthrange(y, mo)[1])
    h, mi, s = rng.randrange(24), rng.randrange(60), rng.randrange(60)
    text = '%04d-%02d-%02d%s%02d:%02d' % (y, mo, d, rng.choice('T '), h, mi)
    us = 0
    if rng.random() < 0.1:
        s = 0
    else:
        text += ':%02d' % s
        if rng.random() < 0.6:
            digits = ''.join(rng.choice('0123456789')
                             for _ in range(rng.randint(1, 9)))
            text += rng.choice('.....,') + digits
            us = int(digits[:6].ljust(6, '0'))
    r = rng.random()
    if r < 0.2:
        off, local = rng.choice([0, 3600, -18000, 19800, 49500, -34200]), 1
    else:
        local = 0
        off = 0 if r < 0.4 else \
            rng.choice([1, -1]) * (rng.randint(0, 14) * 3600 +
                                   rng.choice([0, 0, 15, 30, 45]) * 60)
        text += zone_text(off)
    tz = timezone(timedelta(seconds=off))
    want = (datetime(y, mo, d, h, mi, s, us, tzinfo=tz) - EPOCH) // US
    try:
        alt = datetime.fromisoformat(text)
    except ValueError:
        alt = None
    if alt is not None:
        if alt.tzinfo is None:
            alt = alt.replace(tzinfo=tz)
        checked += 1
        if (alt - EPOCH) // US != want:
            sys.exit('generator: %r: fromisoformat %s, datetime %s'
                     % (text, alt, want))
    cases.append((off if local else 0, text, want))
print('(fromisoformat agreed with the datetime() expectation on %d texts)'
      % checked)
compare('iso', cases, ['parse', 'iso'])
compare('iso/auto', [c for c in cases if rng.random() < 0.25],
        ['parse', 'auto'])

# ISO 8601, dates and times that may not exist.
cases = []
nbad = 0
for k in range(20000):
    y = rng.randint(1970, 2100)
    if rng.random() < 0.3:
        y = rng.choice([1900, 2000, 2100, 2023, 2024, 2096])
    mo, d = rng.randint(0, 13), rng.randint(0, 32)
    if rng.random() < 0.4:
        mo, d = 2, rng.choice([28, 29, 30])
    h = 24 if rng.random() < 0.1 else rng.randrange(24)
    mi = 60 if rng.random() < 0.1 else rng.randrange(60)
    s = rng.randrange(60)
    text = '%04d-%02d-%02dT%02d:%02d:%02dZ' % (y, mo, d, h, mi, s)
    try:
        want = (datetime(y, mo, d, h, mi, s, tzinfo=UTC) - EPOCH) // US
    except ValueError:
        want = None
        nbad += 1
    cases.append((0, text, want))
print('(%d of them impossible for datetime())' % nbad)
compare('iso-invalid', cases, ['parse', 'iso'])

# Epoch numbers, exact.
for kind, digits, scale, lo, hi in (('s', 6, 10**6, -2 * 10**9, 4200000000),
                                    ('ms', 3, 10**3, -2 * 10**12,
                                     4200000000000),
                                    ('us', 0, 1, -2 * 10**15,
                                     4200000000000000)):
    cases = []
    for k in range(20000):
        n = rng.randint(lo, hi)
        text = str(n)
        if digits and rng.random() < 0.5:
            text += '.' + ''.join(rng.choice('0123456789')
                                  for _ in range(rng.randint(1, digits)))
            if rng.random() < 0.2:
                text = '-' + text.lstrip('-')
        want = Fraction(text) * scale
        assert want.denominator == 1
        # The instant itself, through datetime, for years 1906..2103.
        (EPOCH + int(want) * US).isoformat()
        cases.append((0, text, int(want)))
    compare('epoch-' + kind, cases, ['parse', kind])
    if kind == 's':
        compare('epoch-auto', cases, ['parse', 'auto'])


# ts_format and back.
def fmt(dt):
    s = dt.strftime('%Y-%m-%dT%H:%M:%S')
    if dt.microsecond:
        s += ('.%06d' % dt.microsecond).rstrip('0')
    return s + 'Z'


lo = (datetime(1900, 1, 1, tzinfo=UTC) - EPOCH) // US
hi = (datetime(2101, 1, 1, tzinfo=UTC) - EPOCH) // US
ns = []
for k in range(40000):
    n = rng.randrange(lo, hi)
    r = rng.random()
    if r < 0.3:
        n -= n % 10**6
    elif r < 0.5:
        n -= n % 1000
    ns.append(n)
out = run(['format'], [str(n) for n in ns])
bad = 0
for n, got in zip(ns, out):
    want = fmt(EPOCH + n * US)
    if got != want:
        bad += 1
        if bad <= 5:
            print('  format: %d -> %s, Python says %s' % (n, got, want))
print('%-12s %6d cases, %d differ' % ('format', len(ns), bad))
fails += bad
compare('format/back', [(0, t, n) for n, t in zip(ns, out)],
        ['parse', 'auto'])
sys.exit(1 if fails else 0)
PY

# GNU date: a few texts it reads, and a few instants it prints.
fail=0
for s in 2026-03-01T00:01:00Z 2026-03-01T01:01:00+01:00 \
    2026-02-28T18:31:00-0530 '2026-03-01 02:01:00.25+02' \
    2026-03-01T00:01:00.123456Z 1999-12-31T23:59:59-00:30 \
    '2024-02-29 12:00:00+14:00' 2100-12-31T23:59:59Z 1970-01-01T00:00:00Z; do
	want=$(date -u -d "$s" +%s%N)
	want=${want%???}	# nanoseconds to microseconds
	want=$(echo "$want" | sed 's/^0*\([0-9]\)/\1/')
	got=$(printf '0\t%s\n' "$s" | "$tsconv" parse iso)
	if [ "$got" != "$want" ]; then
		echo "  GNU date: '$s' -> $got, date says $want"; fail=1
	fi
done
for sec in 0 1772323260 951825600 4133980799 -1 -2208988800 253402300799; do
	want=$(date -u -d "@$sec" +%Y-%m-%dT%H:%M:%SZ)
	got=$(echo "${sec}000000" | "$tsconv" format)
	if [ "$got" != "$want" ]; then
		echo "  GNU date: @$sec -> $got, date says $want"; fail=1
	fi
done
echo "GNU date: 16 cases, $([ $fail -eq 0 ] && echo none differ || echo some differ)"
exit $fail
