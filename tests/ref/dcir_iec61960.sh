#!/bin/sh
# cw-dcir against the d.c. internal resistance method of IEC 61960
# (secondary lithium cells and batteries for portable applications):
# discharge at I1 = 0.2 C for 10 s, then at I2 = 1 C for 1 s; U1 and U2
# are the voltages at the end of each period and R = (U1 - U2) / (I2 - I1).
# Debian's /usr/bin/python3 writes the procedure, logged once a second,
# for 40 invented cells (0.7 to 50 Ah, 2 to 200 mOhm), interleaved in one
# stream; half of them also have a polarisation that builds up during
# each period (an RC branch), so the standard's R is then more than the
# ohmic one and only the formula on the logged voltages gives it.
# Expected per cell, from the logged values alone: the 1 C step with R by
# the formula above; and, when 0.2 C is at least --min-step (0.5 A), the
# step from rest into the 0.2 C period with R = (U0 - U) / (I1 - 0), U0
# the last rest voltage and U that after the first second at 0.2 C.
# The return to rest after the 1 s pulse must be rejected as unsteady.
# Tolerance: 1e-9 relative (cw-dcir prints 10 significant digits).
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp" <<'PY'
import math, subprocess, sys
import numpy as np

tmp = sys.argv[1]
rng = np.random.default_rng(61960)
rows, expect = [], {}
for k in range(40):
    dev = "CELL-%02d" % k
    cap = float(rng.choice([rng.uniform(0.7, 2.4), rng.uniform(3, 50)]))
    r0 = float(rng.uniform(0.002, 0.2))
    rp, tau = (float(rng.uniform(0.2, 1.0)) * r0, float(rng.uniform(2, 20))) \
        if k % 2 else (0.0, 1.0)
    ocv = float(rng.uniform(3.4, 4.1))
    t0 = 1000 + 37 * k			# epoch seconds, interleaved
    i1, i2 = round(0.2 * cap, 3), round(1.0 * cap, 3)
    prof = [0.0] * 5 + [-i1] * 10 + [-i2] + [0.0] * 5
    up, log = 0.0, []			# up: polarisation voltage (RC)
    for s, cur in enumerate(prof):
        up = up * math.exp(-1 / tau) + cur * rp * (1 - math.exp(-1 / tau))
        v = round(ocv + cur * r0 + up, 6)
        log.append((t0 + s, v, cur))
        rows.append((t0 + s, "%s,%d,%.6f,%.3f,25,50" % (dev, t0 + s, v, cur)))
    u0, u1, u2 = log[4][1], log[14][1], log[15][1]
    exp_steps = {}
    if i1 >= 0.5:		# rest -> first second of 0.2 C
        exp_steps[t0 + 5] = (u0 - log[5][1]) / (i1 - 0.0)
    exp_steps[t0 + 15] = (u1 - u2) / (i2 - i1)	# IEC 61960
    expect[dev] = exp_steps
rows.sort(key=lambda r: r[0])
with open(tmp + "/iec.csv", "w") as f:
    f.write("device,time,voltage_v,current_a,temp_c,soc_pct\n")
    f.writelines(r[1] + "\n" for r in rows)

p = subprocess.run(["cw-dcir", "-v", tmp + "/iec.csv"], capture_output=True,
                   text=True)
assert p.returncode == 0, p.stderr
got = {}
lines = p.stdout.splitlines()
assert lines[0].split(",")[:8] == ["device", "time", "soc_pct", "temp_c",
    "delta_i_a", "delta_v_v", "r_ohm", "r_ref_ohm"], lines[0]
from datetime import datetime
for ln in lines[1:]:
    f = ln.split(",")
    t = int(datetime.strptime(f[1], "%Y-%m-%dT%H:%M:%SZ").replace(
        tzinfo=__import__("datetime").timezone.utc).timestamp())
    got.setdefault(f[0], {})[t] = float(f[6])
bad = 0
nexp = sum(len(v) for v in expect.values())
for dev, st in expect.items():
    g = got.get(dev, {})
    if set(g) != set(st):
        print("%s: steps at %s, expected %s" % (dev, sorted(g), sorted(st)))
        bad += 1
        continue
    for t, r in st.items():
        if abs(g[t] - r) > 1e-9 * r:
            print("%s %d: R %r, IEC 61960 formula %r" % (dev, t, g[t], r))
            bad += 1
unsteady = [l for l in p.stderr.splitlines() if "rejected:" in l]
assert unsteady and " 40 unsteady" in unsteady[0], p.stderr
print("%d cells, %d steps checked against the IEC 61960 formula, %d bad"
      % (len(expect), nexp, bad))
sys.exit(1 if bad else 0)
PY
