#!/usr/bin/python3
"""Invented demo data for cw-capacity: three 10-series e-bike packs rated
14 Ah, one cycle every 12 days for 120 days from 2026-03-02T06:00:00Z, rows
every 10 minutes while they work (the logger sleeps in between: those gaps
end no estimate, they fall between segments).  All names and numbers are
invented.

Each cycle: a rest of 40 minutes (5 rows), a discharge at 2.8 A from
about 90 % down by 60 % of the true capacity, a rest of 40 minutes, a
charge at 2.8 A to 90 % or more and a tapering tail (1.4, 0.7, 0.3,
0.05 A) to about 93 %, which the gauge calls full: it jumps to 100 %
(a reset that comes with the last, 0.05 A, row: below --min-current,
after the segment), a rest
of 40 minutes.  The voltage is 10 cells of cw-synth's invented OCV curve
(testdata/ocv-synth.py) plus 0.1 ohm times the current, so the rests
give OCV points for --ocv.  The gauge reports SoC in tenths of a
percent, its count over the pack's TRUE capacity at that time, plus a
drift of 0.2 points a day since its last full-charge reset (2.4 points
when a cycle begins).

EB-0101  starts at 13.9 Ah and loses 0.004 Ah a day (0.48 Ah, 3.5 %);
         on day 60 its gauge jumps by +4 points mid-discharge (a
         calibration), which splits that discharge in two: the part
         before is short of 20 points, the part after counts.
EB-0102  starts at 12.6 Ah (90 % SoH) and loses 0.012 Ah a day, to
         11.16 Ah (79.7 %) on day 120.
EB-0103  holds 14.1 Ah throughout.
"""
import datetime
import math
import os

T0 = 1772431200          # 2026-03-02T06:00:00Z
STEP = 600
PACKS = [('EB-0101', 13.9, 0.004), ('EB-0102', 12.6, 0.012),
         ('EB-0103', 14.1, 0.0)]
rows = []
for n, (dev, cap0, fade) in enumerate(PACKS):
    for cyc in range(10):
        day = 12 * cyc + n
        t = T0 + day * 86400 + 3600 * n
        cap = cap0 - fade * day
        soc = 0.9                # true, fraction
        drift = 2.4 if cyc else 0.0  # points, 12 days after a reset
        rate = 0.2 / 86400 * STEP
        out = []

        def row(i, temp):
            out.append((t, dev, i, temp, soc, drift))
        row(0.0, 22.0)
        for k in range(4):
            t += STEP
            drift += rate
            row(0.0, 22.0)
        target = soc - 0.6
        k = 0
        while soc > target:
            t += STEP
            soc -= 2.8 * STEP / 3600 / cap
            drift += rate
            if dev == 'EB-0101' and cyc == 5 and k == 5:
                drift += 4.0
            row(-2.8, 24.0 + (k % 4) * 0.5)
            k += 1
        for k in range(4):
            t += STEP
            drift += rate
            row(0.0, 23.0)
        k = 0
        for i in [2.8] * 100 + [1.4, 0.7, 0.3, 0.05]:
            if i == 2.8 and soc >= 0.9:
                continue
            t += STEP
            soc += i * STEP / 3600 / cap
            drift += rate
            if i == 0.05:
                # The reset: the gauge shows 100 % from here, a little
                # above the truth.
                drift = 100 * (1 - soc)
            row(i, 26.0 + (k % 3) * 0.5)
            k += 1
        for k in range(4):
            t += STEP
            row(0.0, 24.0)
        rows.extend(out)
rows.sort(key=lambda r: (r[0], r[1]))


def iso(t):
    return datetime.datetime.fromtimestamp(t, datetime.timezone.utc) \
        .strftime('%Y-%m-%dT%H:%M:%SZ')


def num(x):
    return ('%.3f' % x).rstrip('0').rstrip('.')


here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, 'capacity-fleet.csv'), 'w') as f:
    f.write('device,time,voltage_v,current_a,temp_c,soc_pct\n')
    for t, dev, i, c, s, d in rows:
        shown = min(100.0, max(0.0, round(1000 * s + 10 * d) / 10))
        u = 3.25 + 0.85 * s - 0.25 * math.exp(-15 * s) + 0.10 * s ** 8
        volt = 10 * u + 0.1 * i
        f.write('%s,%s,%s,%s,%s,%s\n' % (dev, iso(t), num(volt), num(i),
                                         num(c), num(shown)))
