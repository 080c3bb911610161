#!/usr/bin/python3
"""Invented demo data for cw-topoff: one night of a small invented fleet.

TERM-31  handheld terminal, 3 Ah, sits in its dock from 17:00 to 07:00.
         Standby load 0.15 A; the dock's charger gives 0.75 A (net +0.6 A)
         from the moment the true SoC falls below 97 % until it is back at
         100 %.  The gauge reports whole percent (rounded).
EB-0107  e-bike, 14 Ah, charged from 30 % at 4 A with a taper, unplugged
         ten minutes after the charger stops, then ridden at -8 A with a
         regenerative pulse every fourth row.  SoC to 0.1 %.
CART-02  utility cart, 7S pack, 20 Ah, a gauge without SoC: voltage only.
         Charger restarts when the resting voltage falls below 29.10 V.
Rows every 5 minutes.  The current of a row is the mean over the five
minutes that end at the row (the sample stream's convention), so charge
is the sum of I * 300 s.  All names and numbers are invented.
"""
import sys

STEP = 300.0
T0 = 1770051600            # 2026-02-02T17:00:00Z

def iso(t):
    import datetime
    return datetime.datetime.fromtimestamp(t, datetime.timezone.utc) \
        .strftime('%Y-%m-%dT%H:%M:%SZ')

rows = []
truth = {}

# TERM-31: integrate at 1 s, report every 300 s (mean current).
soc, on, restarts, acc = 88.0, True, 0, 0.0
cap = 3.0
for sec in range(0, 15 * 3600 + 1):
    if sec > 0:
        if sec <= 14 * 3600:           # in the dock
            if not on and soc < 97.0:
                on, restarts = True, restarts + 1
            i = (1.2 if sec < 3600 else 0.6) if on else -0.15
            soc += 100.0 * i / 3600.0 / cap
            if on and soc >= 100.0:
                on = False
        else:                           # taken out and used
            i = -0.6
            soc += 100.0 * i / 3600.0 / cap
        acc += i
    if sec % 300 == 0:
        v = 2 * (3.5 + 0.7 * soc / 100.0)
        ia = acc / 300.0 if sec > 0 else 0.0
        rows.append((T0 + sec, 'TERM-31', v, ia, 22.0, '%d' % int(soc + 0.5)))
        acc = 0.0
truth['TERM-31'] = restarts

# EB-0107.
soc, cap, t = 30.0, 14.0, T0
k = 0
def eb(i):
    global soc, t, k
    soc += 100.0 * i * STEP / 3600.0 / cap
    t += STEP
    k += 1
    rows.append((t, 'EB-0107', 10 * (3.5 + 0.7 * soc / 100.0) + 0.05 * i,
                 i, 18.0, '%.1f' % soc))
rows.append((t, 'EB-0107', 10 * (3.5 + 0.7 * soc / 100.0), 0.0, 18.0,
             '%.1f' % soc))
while soc < 92.0:
    eb(4.0)
while soc < 99.9:
    eb(max(0.5, 4.0 * (100.0 - soc) / 8.0))
eb(0.0); eb(0.0)
for j in range(16):
    eb(2.0 if j % 4 == 3 else -8.0)
truth['EB-0107'] = 0

# CART-02: voltage only.
soc, cap, on, restarts, acc = 90.0, 20.0, True, 0, 0.0
for sec in range(0, 12 * 3600 + 1):
    if sec > 0:
        vrest = 7 * (3.5 + 0.7 * soc / 100.0)
        if not on and vrest < 29.10:
            on, restarts = True, restarts + 1
        i = 3.0 if on else -0.4
        soc += 100.0 * i / 3600.0 / cap
        if on and soc >= 100.0:
            on = False
        acc += i
    if sec % 300 == 0:
        ia = acc / 300.0 if sec > 0 else 0.0
        v = 7 * (3.5 + 0.7 * soc / 100.0) + 0.02 * ia
        rows.append((T0 + sec, 'CART-02', v, ia, 15.0, ''))
        acc = 0.0
truth['CART-02'] = restarts

rows.sort(key=lambda r: (r[0], r[1]))
out = open(sys.argv[1], 'w')
out.write('device,time,voltage_v,current_a,temp_c,soc_pct\n')
for t, d, v, i, tc, s in rows:
    out.write('%s,%s,%.3f,%.3f,%.1f,%s\n' % (d, iso(t), v, i, tc, s))
print(truth, file=sys.stderr)
