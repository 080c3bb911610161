#!/bin/sh
# cw-clean's unit conversions against their definitions, evaluated here
# in Debian's Python (/usr/bin/python3) with exact fractions:
#   mV, mA   the SI prefix milli = 10^-3 (SI Brochure, 9th ed., 2019,
#            table 7): V = mV / 1000, A = mA / 1000;
#   K        t/degC = T/K - 273.15, the definition of the Celsius
#            temperature (SI Brochure, 9th ed., 2.3.1);
#   dK       tenths of a kelvin, as gauges report: C = dK / 10 - 273.15;
#   dC       tenths of a degree Celsius: C = dC / 10;
#   F        t/degF = 1.8 t/degC + 32 (NIST SP 811, 2008, B.9), so
#            C = (F - 32) * 5 / 9;
#   frac     SoC as a fraction: percent = frac * 100.
# Each unit is given two ways: with -c field=header:unit, and by a header
# name whose suffix says the unit (pack_mv, current_ma, temp_k, temp_dk,
# temp_dc, temp_f, soc_frac); both must give the defined value to 1e-9
# relative (cw-clean writes 10 significant digits).  Random values over
# the plausible range, 2000 rows per unit.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import csv, math, random, subprocess, sys
from fractions import Fraction as Fr

tmp = sys.argv[1]
rng = random.Random(61960)
N = 2000
# unit: (field, header suffix, output column, raw value maker, definition)
units = {
    'mV': ('voltage', 'pack_mv', 'voltage_v',
           lambda: str(rng.randrange(1500, 5001)),
           lambda x: x / 1000),
    'mA': ('current', 'current_ma', 'current_a',
           lambda: str(rng.randrange(-200000, 200001)),
           lambda x: x / 1000),
    'K': ('temp', 'temp_k', 'temp_c',
          lambda: '%.2f' % rng.uniform(233.15, 373.15),
          lambda x: x - Fr('273.15')),
    'dK': ('temp', 'temp_dk', 'temp_c',
           lambda: str(rng.randrange(2332, 3731)),
           lambda x: x / 10 - Fr('273.15')),
    'dC': ('temp', 'temp_dc', 'temp_c',
           lambda: str(rng.randrange(-400, 1001)),
           lambda x: x / 10),
    'F': ('temp', 'temp_f', 'temp_c',
          lambda: '%.1f' % rng.uniform(-40, 212),
          lambda x: (x - 32) * 5 / 9),
    'frac': ('soc', 'soc_frac', 'soc_pct',
             lambda: '%.4f' % rng.uniform(0, 1),
             lambda x: x * 100),
}
fails = 0
for unit, (field, suffix, col, make, define) in units.items():
    raw = [make() for _ in range(N)]
    # The other fields in canonical units; the field under test in its
    # unit under two headers: 'x' (for -c) and the suffixed name.
    path = '%s/%s.csv' % (tmp, unit)
    base = {'voltage': 'voltage_v', 'current': 'current_a', 'temp': 'temp_c',
            'soc': 'soc_pct'}
    others = [base[f] for f in base if f != field]
    with open(path, 'w', newline='') as f:
        w = csv.writer(f, lineterminator='\n')
        w.writerow(['device', 'time'] + others + [suffix])
        for k, r in enumerate(raw):
            vals = {'voltage_v': '3.7', 'current_a': '-1.5', 'temp_c': '20',
                    'soc_pct': '50'}
            w.writerow(['P', 1772323200 + k] + [vals[o] for o in others] + [r])
    for how, args in [('-c', ['-c', '%s=%s:%s' % (field, suffix, unit)]),
                      ('header', [])]:
        p = subprocess.run(['cw-clean'] + args + [path], capture_output=True,
                           text=True)
        if p.returncode != 0:
            sys.exit('%s %s: cw-clean exit %d: %s' % (unit, how, p.returncode,
                                                      p.stderr))
        rows = list(csv.DictReader(p.stdout.splitlines()))
        bad = 0 if len(rows) == N else N
        for r, x in zip(rows, raw):
            want = float(define(Fr(x)))
            got = float(r[col])
            if not math.isclose(got, want, rel_tol=1e-9, abs_tol=1e-9):
                bad += 1
                if bad <= 3:
                    print('  %s %s: %s %s -> %r, defined %r' % (unit, how, x,
                          unit, got, want))
        print('%-5s %-7s %d rows, %d differ' % (unit, how, len(rows), bad))
        fails += bad
# Fixed points of the scales, exactly (from the definitions above).
fixed = [('F', '-40', '-40'), ('F', '32', '0'), ('F', '212', '100'),
         ('K', '273.15', '0'), ('dK', '2731.5', '0'), ('dK', '2981.5', '25'),
         ('mV', '4200', '4.2'), ('mA', '-2350', '-2.35')]
path = tmp + '/fixed.csv'
for unit, x, want in fixed:
    field, suffix, col = units[unit][:3]
    with open(path, 'w') as f:
        f.write('device,time,voltage_v,current_a,temp_c,soc_pct,%s\n' % suffix)
        f.write('P,1772323200,3.7,-1.5,20,50,%s\n' % x)
    spec = '%s=%s:%s' % (field, suffix, unit)
    out = subprocess.run(['cw-clean', '-c', spec, path], capture_output=True,
                         text=True).stdout
    got = list(csv.DictReader(out.splitlines()))[0][col]
    ok = got == want
    print('%-5s %8s -> %-6s %s' % (unit, x, got, 'ok' if ok else
                                   'differs, defined ' + want))
    fails += not ok
print('%d differences' % fails)
sys.exit(1 if fails else 0)
PY
