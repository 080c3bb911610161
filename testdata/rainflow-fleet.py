#!/usr/bin/python3
"""Invented demo data for cw-rainflow: three 10-series packs, rows every
10 minutes from 2026-03-02T06:00:00Z.  All names and numbers are invented.

EB-0101  e-bike.  SoC 90 -> 30 -> 80 -> 20 -> 95 in steps of 5 %, with a
         gauge wobble 60 -> 60.5 -> 55 on the first ride (a reversal of
         0.5 %, below the default hysteresis of 1 %).
         Turning points 90, 30, 80, 20, 95.  ASTM E1049-85 5.4.4 by hand:
         30-80 closes (X = 60 >= Y = 50): one cycle of 50; 90-20 is a
         start-point half cycle of 70; the residue 20-95 a half of 75.
         2 cycles, range sum 50 + 35 + 37.5 = 122.5, efc 1.225.
SC-0203  scooter, shallow use.  70 -> 58 -> 66 -> 52 -> 64 -> 50 in steps
         of 2 %.  58-66 closes (8), then 52-64 (12); residue 70-50 (half
         of 20).  2.5 cycles, range sum 30, efc 0.3.
CT-0305  cart, held on its charger at 100 % between shifts: 100 (4 rows)
         -> 40 -> 100 (3 rows) -> 35 -> 100 (3 rows) in steps of 10 %
         (5 % from 40 to 35 and from 95 to 100).  A held 100 % counts once,
         at its first row.  The standard counts halves 100-40, 40-100
         (60 each), 100-35, 35-100 (65 each): 2 cycles, range sum 125,
         efc 1.25.

Writes rainflow-fleet.csv (the sample stream) and rainflow-raw.csv (the
same rows as a raw gauge log: pack, timestamp, mV, mA, 0.1 K, SoC).
"""
import datetime
import os

T0 = 1772431200            # 2026-03-02T06:00:00Z
STEP = 600


def path(*legs):
    """Join straight legs (start, end, step) into one list of values."""
    out = [legs[0][0]]
    for a, b, s in legs:
        assert out[-1] == a
        d = s if b > a else -s
        v = a
        while v != b:
            v = round(v + d, 1)
            out.append(v)
    return out


eb = path((90, 60, 5)) + [60.5] + path((55, 30, 5))
eb += path((30, 80, 5))[1:] + path((80, 20, 5))[1:] + path((20, 95, 5))[1:]
sc = path((70, 58, 2), (58, 66, 2), (66, 52, 2), (52, 64, 2), (64, 50, 2))
ct = [100] * 3 + path((100, 40, 10))
ct += path((40, 100, 10))[1:] + [100] * 2 + path((100, 40, 10))[1:] + [35]
ct += path((35, 45, 10))[1:] + path((45, 95, 10))[1:] + [100] * 3

packs = [("EB-0101", eb, 10.0, 19.0), ("SC-0203", sc, 6.0, 23.0),
         ("CT-0305", ct, 15.0, 27.0)]

rows = []
for dev, soc, amps, temp in packs:
    prev = soc[0]
    for k, s in enumerate(soc):
        cur = 0.0 if s == prev else (amps if s > prev else -amps)
        if k == 0:
            cur = 0.0
        volt = 10 * (3.40 + 0.78 * s / 100.0)
        t = T0 + STEP * k
        rows.append((t, dev, volt, cur, temp + (k % 5) * 0.3, s))
        prev = s
rows.sort(key=lambda r: (r[0], r[1]))


def iso(t):
    return datetime.datetime.fromtimestamp(t, datetime.timezone.utc) \
        .strftime('%Y-%m-%dT%H:%M:%SZ')


def num(x):
    return ('%.3f' % x).rstrip('0').rstrip('.')


here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, 'rainflow-fleet.csv'), 'w') as f:
    f.write('device,time,voltage_v,current_a,temp_c,soc_pct\n')
    for t, dev, v, i, c, s in rows:
        f.write('%s,%s,%s,%s,%s,%s\n' % (dev, iso(t), num(v), num(i),
                                         num(c), num(s)))
with open(os.path.join(here, 'rainflow-raw.csv'), 'w') as f:
    f.write('pack,timestamp,pack_mv,current_ma,temp_dk,soc\n')
    for t, dev, v, i, c, s in rows:
        f.write('%s,%s,%d,%d,%d,%s\n' % (dev, iso(t), round(v * 1000),
                                         round(i * 1000),
                                         round((c + 273.15) * 10), num(s)))
