#!/usr/bin/python3
"""The open-circuit-voltage table of cw-synth's invented cell, per cell,
from the curve its manual gives (cw-synth(1), The physics):
U(s) = 3.25 + 0.85 s - 0.25 exp(-15 s) + 0.10 s^8 for SoC s in 0..1,
every percent.  Invented; not fitted to any cell."""
import math
import os

here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, 'ocv-synth.csv'), 'w') as f:
    f.write('soc_pct,voltage_v\n')
    for k in range(101):
        s = k / 100
        u = 3.25 + 0.85 * s - 0.25 * math.exp(-15 * s) + 0.10 * s ** 8
        f.write('%d,%.6f\n' % (k, u))
