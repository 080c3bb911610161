#!/bin/sh
# cw-wear over random histories (interleaved devices, rows without SoC or
# temperature, charging in the cold and heat, a long gap) against an
# independent Python implementation of the same definitions:
#   rainflow counting by the three-point rule of ASTM E1049-85 (reapproved
#   2017) section 5.4.4, the residue as half cycles (its step 6);
#   the model of Xu et al., IEEE Trans. Smart Grid 9(2):1131-1140, 2018,
#   with its published constants (LMO cells): cycle damage
#   count * S_d * S_s * S_T at each cycle's depth, mean SoC and mean
#   temperature of its turning points, calendar damage by the trapezoid
#   rule over k_t * S_s * S_T (numpy.trapz), fade through the SEI term;
#   the shares as SPEC.md defines them;
#   charge as lib/charge.h defines it (a row's current over the interval
#   ending at it, none over a gap above 15 minutes), and the zones of
#   cw-thermal (below 0 C cold, 0 to 10 C cool, above 45 C hot);
#   across a gap above 15 minutes the state before it is held (cw-wear(1)).
# Every reversal in the data is far above the 1 % hysteresis and no value
# repeats, so the turning points are the plain local extremes.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
/usr/bin/python3 - "$tmp/in.csv" <<'PY'
import random, sys
rnd = random.Random(20260301)
rows = []
t0 = 1767225600
# A cold, a mild and a hot pack: temperature wanders within its band.
for dev, lo, hi in (("R1", -8.0, 20.0), ("R2", 5.0, 40.0), ("R3", 30.0, 58.0)):
    t, soc, temp = t0 + rnd.randrange(0, 600), rnd.uniform(20, 80), (lo + hi) / 2
    n = 0
    while n < 4000:
        target = rnd.uniform(0, 100)
        if abs(target - soc) < 8:
            continue
        step = rnd.uniform(0.6, 2.5) * (1 if target > soc else -1)
        cur = 3.0 * (1 if step > 0 else -1) * rnd.uniform(0.5, 1.5)
        while (target - soc) * step > 0 and n < 4000:
            soc = min(max(soc + step, 0.0), 100.0)
            temp = min(max(temp + rnd.gauss(0, 0.8), lo), hi)
            dt = 60 if rnd.random() > 0.002 else 3 * 3600   # a few long gaps
            t += dt
            s = "%.3f" % soc
            c = "%.2f" % temp
            if rnd.random() < 0.03: s = ""      # no SoC
            if rnd.random() < 0.03: c = ""      # no temperature
            rows.append((t, dev, "%.3f" % (3.6 + soc / 200), "%.3f" % cur, c, s))
            n += 1
            if soc in (0.0, 100.0):
                break
rows.sort()
with open(sys.argv[1], "w") as f:
    f.write("device,time,voltage_v,current_a,temp_c,soc_pct\n")
    for t, dev, v, i, c, s in rows:
        f.write("%s,%d,%s,%s,%s,%s\n" % (dev, t, v, i, c, s))
PY
cw-wear "$tmp/in.csv" >"$tmp/out.csv"
/usr/bin/python3 - "$tmp/in.csv" "$tmp/out.csv" <<'PY'
import csv, math, sys
import numpy as np
from scipy.optimize import brentq

k_d1, k_d2, k_d3 = 1.40e5, -0.501, -1.23e5     # Xu et al. 2018
k_s, s_ref = 1.04, 0.5
k_T, T_ref = 6.93e-2, 298.15
k_t = 4.14e-10
a_sei, b_sei = 5.75e-2, 121.0
def S_d(d): return 1.0 / (k_d1 * d ** k_d2 + k_d3) if d > 0 else 0.0
def S_s(s): return math.exp(k_s * (s - s_ref))
def S_T(c):
    T = c + 273.15
    return math.exp(k_T * (T - T_ref) * T_ref / T)
def L(f): return 1 - a_sei * math.exp(-b_sei * f) - (1 - a_sei) * math.exp(-f)
f_eol = brentq(lambda f: L(f) - 0.20, 1e-9, 5.0, xtol=1e-15)
GAP = 900.0

def rainflow(pts):
    """ASTM E1049-85 5.4.4 on turning points [(x, aux)]; yields
    (range, mean, count, aux_mean)."""
    out, st = [], []
    for p in pts:
        st.append(p)
        while len(st) >= 3:
            X = abs(st[-1][0] - st[-2][0]); Y = abs(st[-2][0] - st[-3][0])
            if X < Y:
                break
            a, b = st[-3], st[-2]
            out.append((Y, (a[0] + b[0]) / 2, 0.5 if len(st) == 3 else 1.0, auxmean(a, b)))
            if len(st) == 3:
                del st[0]
            else:
                del st[-3:-1]
    for a, b in zip(st, st[1:]):
        out.append((abs(a[0] - b[0]), (a[0] + b[0]) / 2, 0.5, auxmean(a, b)))
    return out
def auxmean(a, b):
    v = [x[1] for x in (a, b) if x[1] is not None]
    return sum(v) / len(v) if v else None
def turning(seq):
    tp = [seq[0]]
    for k in range(1, len(seq) - 1):
        if (seq[k][0] - seq[k-1][0]) * (seq[k+1][0] - seq[k][0]) < 0:
            tp.append(seq[k])
    tp.append(seq[-1])
    return tp
def above(a, b, th, dt):
    if a >= th and b >= th: return dt
    if a < th and b < th: return 0.0
    return dt * ((a - th) / (a - b) if a >= th else (b - th) / (b - a))
def num(x): return float(x) if x != "" else None
# The Shapley split of SPEC.md, per unit of A: the SoC and heat excess.
def shap(s, tau):
    both = (s - 1) * (tau - 1) / 2
    return (s - 1) + both, (tau - 1) + both

devs = {}
for r in csv.DictReader(open(sys.argv[1])):
    devs.setdefault(r["device"], []).append(
        (float(r["time"]), float(r["current_a"]), num(r["temp_c"]), num(r["soc_pct"])))
want = {}
for dev, rs in devs.items():
    w = {}
    ch = cold = cool = hot = 0.0
    for (t0, _, _, _), (t1, i, c, _) in zip(rs, rs[1:]):
        dt = t1 - t0
        if i > 0.05 and 0 < dt <= GAP:
            ah = i * dt / 3600; ch += ah
            if c is not None and c < 0: cold += ah
            if c is not None and 0 <= c < 10: cool += ah
            if c is not None and c > 45: hot += ah
    w["charge_ah"], w["cold_charge_ah"], w["hot_charge_ah"] = ch, cold, hot
    w["cool_charge_ah"] = cool
    def hours(idx, th):
        v = [(r[0], r[idx]) for r in rs if r[idx] is not None]
        h = 0.0
        for (t0, a), (t1, b) in zip(v, v[1:]):
            h += above(a, b, th, t1 - t0) if t1 - t0 <= GAP else (t1 - t0 if a >= th else 0)
        return h / 3600
    w["hours_near_full"] = hours(3, 95.0)
    w["hours_hot"] = hours(2, 45.0)
    # Calendar: trapezoid between rows with both, the earlier held over gaps.
    m = [(r[0], r[3] / 100, r[2]) for r in rs if r[2] is not None and r[3] is not None]
    t = np.array([x[0] for x in m])
    rate = {k: np.array([k_t * g(x[1], x[2]) for x in m]) for k, g in (
        ("full", lambda s, c: S_s(s) * S_T(c)),
        ("ref", lambda s, c: 1.0),
        ("soc", lambda s, c: shap(S_s(s), S_T(c))[0]),
        ("temp", lambda s, c: shap(S_s(s), S_T(c))[1]))}
    dt = np.diff(t)
    cal = {}
    for k, r in rate.items():
        trap = (r[1:] + r[:-1]) / 2
        cal[k] = float(np.sum(np.where(dt <= GAP, trap, r[:-1]) * dt))
    # np.trapz gives the same where no gap is held (a cross-check):
    assert abs(np.trapz(rate["full"], t) - cal["full"]) <= 1e-12 or np.any(dt > GAP)
    # Cycles: the rows with SoC, temperature as aux where there is one.
    seq = [(r[3], r[2]) for r in rs if r[3] is not None]
    cyc = {"full": 0.0, "soc": 0.0, "temp": 0.0, "d": 0.0}
    efc = maxd = 0.0
    for rng, mean, cnt, aux in rainflow(turning(seq)):
        efc += cnt * rng / 100; maxd = max(maxd, rng)
        if aux is None:
            continue
        sd, ss, sT = S_d(rng / 100), S_s(mean / 100), S_T(aux)
        cyc["full"] += cnt * sd * ss * sT
        cyc["soc"] += cnt * sd * shap(ss, sT)[0]
        cyc["temp"] += cnt * sd * shap(ss, sT)[1]
        cyc["d"] += cnt * sd
    f = cyc["full"] + cal["full"]
    w["efc"], w["max_depth_pct"] = efc, maxd
    w["damage"], w["fade_pct"] = f, 100 * L(f)
    w["share_age"] = cal["ref"] / f
    w["share_cycling"] = cyc["d"] / f
    w["share_high_soc"] = (cyc["soc"] + cal["soc"]) / f
    w["share_heat"] = (cyc["temp"] + cal["temp"]) / f
    w["days_to_eol"] = max(f_eol - f, 0) / (f / (t[-1] - t[0])) / 86400
    if ch > 0 and cold >= 0.01 * ch:
        w["days_to_eol"] = None     # cold-charge: no life told (SPEC.md)
    w["days"] = (rs[-1][0] - rs[0][0]) / 86400
    want[dev] = w
got = {r["device"]: r for r in csv.DictReader(open(sys.argv[2]))}
bad = 0
for dev in sorted(want):
    for col, v in want[dev].items():
        g = got[dev][col]
        ok = g == "" if v is None else \
            g != "" and abs(float(g) - v) <= max(1e-7 * abs(v), 1e-10)
        print("%s %s %s: got %s, want %s" % ("ok  " if ok else "FAIL", dev, col, g, "empty" if v is None else "%.10g" % v))
        bad += not ok
sys.exit(1 if bad else 0)
PY
