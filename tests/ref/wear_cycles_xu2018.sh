#!/bin/sh
# cw-wear, cycle aging, against the published equations of Xu et al.,
# IEEE Trans. Smart Grid 9(2):1131-1140, 2018 (constants as published,
# LMO cells), evaluated independently below in Debian's Python:
#   ONE   one full cycle 0-100-0 % at 25 C: its depth-only damage is
#         S_d(1) = 1 / (1.4e5 - 1.23e5) (the DoD stress at d = 1)
#   HOT   100 cycles 40-90-40 % at 40 C: sum of S_d(0.5) S_s(0.65) S_T(40)
#   L500  500 full cycles at 25 C, --cycle-life 500: 20 % fade (the usual
#         rating of a phone-class cell, about 20 % lost after 500 full
#         cycles: common practice, no source)
#   L250  250 of them: half that damage
# The calendar term (trapezoid rule over the rows, Xu's k_t S_s S_T) is
# added in the expected totals; with --calendar-life 1e9 days it vanishes
# and L500 must show 20 % fade from the cycles alone.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
# One row every 6 minutes; SoC moves 10 % a row (1 h a half cycle).
awk 'function leg(dev, n, lo, hi, temp,   c, k) {
	for (c = 0; c < n; c++) {
		for (k = 0; k < 10; k++) row(dev, lo + (hi - lo) * k / 10, 2, temp)
		for (k = 10; k > 0; k--) row(dev, lo + (hi - lo) * k / 10, -2, temp)
	}
	row(dev, lo, -2, temp)
}
function row(dev, soc, i, temp) {
	printf "%s,%d,3.8,%g,%g,%g\n", dev, T[dev], i, temp, soc
	T[dev] += 360
}
BEGIN {
	print "device,time,voltage_v,current_a,temp_c,soc_pct"
	T["ONE"] = T["HOT"] = T["L500"] = T["L250"] = 1767225600
	leg("ONE", 1, 0, 100, 25)
	leg("HOT", 100, 40, 90, 40)
	leg("L500", 500, 0, 100, 25)
	leg("L250", 250, 0, 100, 25)
}' >"$tmp/in.csv"
cw-wear "$tmp/in.csv" >"$tmp/unscaled.csv"
cw-wear --cycle-life 500 "$tmp/in.csv" >"$tmp/scaled.csv"
cw-wear --cycle-life 500 --calendar-life 1e9 "$tmp/in.csv" >"$tmp/cyc.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import csv, math, sys
import numpy as np
from scipy.optimize import brentq

# Xu et al. 2018, the published constants (typed here from the paper).
k_d1, k_d2, k_d3 = 1.40e5, -0.501, -1.23e5
k_s, s_ref = 1.04, 0.5
k_T, T_ref = 6.93e-2, 298.15
k_t = 4.14e-10
a_sei, b_sei = 5.75e-2, 121.0
def S_d(d): return 1.0 / (k_d1 * d ** k_d2 + k_d3)
def S_s(s): return np.exp(k_s * (np.asarray(s) - s_ref))
def S_T(c):
    T = np.asarray(c) + 273.15
    return np.exp(k_T * (T - T_ref) * T_ref / T)
def L(f): return 1 - a_sei * math.exp(-b_sei * f) - (1 - a_sei) * math.exp(-f)
f_eol = brentq(lambda f: L(f) - 0.20, 1e-9, 5.0, xtol=1e-15)

tmp = sys.argv[1]
data = {}
for r in csv.DictReader(open(tmp + "/in.csv")):
    d = data.setdefault(r["device"], ([], [], []))
    d[0].append(float(r["time"])); d[1].append(float(r["soc_pct"]) / 100)
    d[2].append(float(r["temp_c"]))
def cal(dev):
    t, s, c = (np.array(x) for x in data[dev])
    return np.trapz(k_t * S_s(s) * S_T(c), t)
def load(name): return {r["device"]: r for r in csv.DictReader(open(tmp + "/" + name))}
out = {n: load(n + ".csv") for n in ("unscaled", "scaled", "cyc")}
bad = 0
def check(run, dev, col, want, rel=1e-7, absol=1e-12):
    global bad
    got = out[run][dev][col]
    ok = got != "" and abs(float(got) - want) <= max(rel * abs(want), absol)
    print("%s %s %s %s: got %r, want %r" % ("ok  " if ok else "FAIL", run, dev, col, got, want))
    bad += not ok

# ONE: the depth-only damage of one full cycle is S_d(1).
r = out["unscaled"]["ONE"]
check("unscaled", "ONE", "efc", 1.0)
check("unscaled", "ONE", "max_depth_pct", 100.0)
got = float(r["share_cycling"]) * float(r["damage"])
ok = abs(got - 1 / (1.4e5 - 1.23e5)) <= 1e-7 / 17000
print("%s unscaled ONE depth-only damage %r, want 1/17000 = %r" % ("ok  " if ok else "FAIL", got, 1 / 17000))
bad += not ok
check("unscaled", "ONE", "damage", S_d(1.0) + cal("ONE"))
# HOT: 100 cycles of depth 0.5, mean SoC 0.65, 40 C.
cyc = 100 * S_d(0.5) * S_s(0.65) * S_T(40.0)
check("unscaled", "HOT", "efc", 50.0)
check("unscaled", "HOT", "damage", cyc + cal("HOT"))
check("unscaled", "HOT", "share_cycling", 100 * S_d(0.5) / (cyc + cal("HOT")))
# The Shapley split of SPEC.md: each term A s tau gives A (s-1) +
# A (s-1) (tau-1) / 2 to share_high_soc, A (tau-1) + the same half to
# share_heat; the cycles' A is 100 S_d(0.5), the calendar's k_t dt.
def parts(A, s, tau):
    both = A * (s - 1) * (tau - 1) / 2
    return A * (s - 1) + both, A * (tau - 1) + both
t, s, c = (np.array(x) for x in data["HOT"])
cs, ct = parts(100 * S_d(0.5), S_s(0.65), S_T(40.0))
ks, kt_ = parts(k_t, S_s(s), S_T(c))
f = cyc + cal("HOT")
check("unscaled", "HOT", "share_high_soc", (cs + np.trapz(ks, t)) / f)
check("unscaled", "HOT", "share_heat", (ct + np.trapz(kt_, t)) / f)
check("unscaled", "HOT", "share_age", k_t * (t[-1] - t[0]) / f)
# --cycle-life 500: the scale makes 500 S_d(1) reach f_eol.
scale = f_eol / (500 * S_d(1.0))
for dev, n in (("L500", 500), ("L250", 250)):
    f = n * S_d(1.0) * scale + cal(dev)
    check("scaled", dev, "efc", float(n))
    check("scaled", dev, "damage", f)
    check("scaled", dev, "fade_pct", 100 * L(f))
    span = (data[dev][0][-1] - data[dev][0][0])
    check("scaled", dev, "days_to_eol", max(f_eol - f, 0) / (f / span) / 86400, absol=1e-9)
# Cycles alone: exactly 20 % at 500 cycles, and L(f_eol / 2) at 250.
check("cyc", "L500", "fade_pct", 20.0, rel=1e-6)
check("cyc", "L500", "days_to_eol", 0.0)
check("cyc", "L250", "fade_pct", 100 * L(f_eol / 2), rel=1e-6)
check("cyc", "L250", "share_cycling", 1.0, rel=1e-6)
sys.exit(1 if bad else 0)
PY
