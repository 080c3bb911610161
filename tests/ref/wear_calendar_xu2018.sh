#!/bin/sh
# cw-wear, calendar aging at constant conditions, against the published
# equations of Xu, Oudalov, Ulbig, Andersson, Kirschen, "Modeling of
# Lithium-Ion Battery Degradation for Cell Life Assessment", IEEE Trans.
# Smart Grid 9(2):1131-1140, 2018 (constants as published, LMO cells),
# evaluated independently below in Debian's Python (scipy's brentq for the
# end of life).  365 days at rest, a row every 10 minutes, for:
#   P25   50 % SoC, 25 C  (the reference point: S_s = S_T = 1)
#   P35   50 % SoC, 35 C  (heat)
#   F25  100 % SoC, 25 C  (high SoC)
#   F35  100 % SoC, 35 C  (both)
#   C10   30 % SoC, 10 C  (emptier and cooler: negative shares)
# The shares (SPEC.md, cw-wear): the calendar term A s tau split into A
# (share_age) and the Shapley split of the excess, A (s-1) + A (s-1)
# (tau-1) / 2 to share_high_soc and A (tau-1) + A (s-1) (tau-1) / 2 to
# share_heat, each over f; checked to 1e-9 (the issue asks for 1e-3), and
# that they add up to 1 to 1e-9.  dominant: the largest of the SoC and
# heat shares when at least 0.25, else none (SPEC.md).
# Packs in service, through the fleet file, 365 days at 50 %, 25 C:
#   S90   measured SoH 90 %: f0 from L(f0) = 0.10 (brentq), the year's
#         fade L(f0 + f) - L(f0) in points, soh_pct 90 - that, and
#         days_to_eol to L = 0.20 at the year's pace; prior "soh"
#   A365  in service a year before the first row, 200 full cycles before
#         (efc_prior), --cycle-life 500: f0 = k_t * 365 d + 200 * f20 /
#         500 (rest and cycles at reference, f20 = L^-1(0.20)); "age"
#   NEW   not in the fleet file: f0 = 0, "new"
# The constants below are typed from the paper's parameter table as
# recalled (k_s, k_T, k_t, alpha_sei, beta_sei), not re-read from it for
# this check: they agree with lib/xu2018.c, so this check proves the
# equations and the split, not the constants.
# End of life at 20 % fade (80 % state of health): common practice, no
# source.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
awk 'BEGIN {
	print "device,time,voltage_v,current_a,temp_c,soc_pct"
	t0 = 1767225600	# 2026-01-01T00:00:00Z
	for (k = 0; k <= 365 * 144; k++) {
		t = t0 + 600 * k
		printf "P25,%d,3.8,0,25,50\n", t
		printf "P35,%d,3.8,0,35,50\n", t
		printf "F25,%d,4.2,0,25,100\n", t
		printf "F35,%d,4.2,0,35,100\n", t
		printf "C10,%d,3.6,0,10,30\n", t
		printf "S90,%d,3.8,0,25,50\n", t
		printf "A365,%d,3.8,0,25,50\n", t
		printf "NEW,%d,3.8,0,25,50\n", t
	}
}' >"$tmp/in.csv"
printf 'device,soh_pct,in_service,efc_prior\nS90,90,,\nA365,,2025-01-01,200\n' \
    >"$tmp/fleet.csv"
cw-wear --fleet "$tmp/fleet.csv" "$tmp/in.csv" >"$tmp/out.csv"
cw-wear --fleet "$tmp/fleet.csv" --cycle-life 500 "$tmp/in.csv" \
    >"$tmp/rated.csv"
/usr/bin/python3 - "$tmp/out.csv" "$tmp/rated.csv" <<'PY'
import csv, math, sys
from scipy.optimize import brentq

# Xu et al. 2018, the published constants (typed here from the paper).
k_s, s_ref = 1.04, 0.5
k_T, T_ref = 6.93e-2, 298.15
k_t = 4.14e-10
a_sei, b_sei = 5.75e-2, 121.0

def S_s(s): return math.exp(k_s * (s - s_ref))
def S_T(c):
    T = c + 273.15
    return math.exp(k_T * (T - T_ref) * T_ref / T)
def L(f): return 1 - a_sei * math.exp(-b_sei * f) - (1 - a_sei) * math.exp(-f)

t = 365 * 86400.0
f_eol = brentq(lambda f: L(f) - 0.20, 1e-9, 5.0, xtol=1e-15)
cases = {"P25": (0.5, 25.0), "P35": (0.5, 35.0),
         "F25": (1.0, 25.0), "F35": (1.0, 35.0), "C10": (0.3, 10.0)}
rows = {r["device"]: r for r in csv.DictReader(open(sys.argv[1]))}
rated = {r["device"]: r for r in csv.DictReader(open(sys.argv[2]))}
bad = 0
def check(dev, col, want, rel=1e-7, absol=1e-12):
    global bad
    got = rows[dev][col]
    if want is None:
        ok = got == ""
    else:
        ok = got != "" and abs(float(got) - want) <= max(rel * abs(want), absol)
    print("%s %s %s: got %r, want %r" % ("ok  " if ok else "FAIL", dev, col, got, want))
    bad += not ok
for dev, (s, c) in cases.items():
    A, ss, tau = k_t * t, S_s(s), S_T(c)
    f = A * ss * tau
    sh = {"share_age": A / f, "share_cycling": 0.0,
          "share_high_soc": (A * (ss - 1) + A * (ss - 1) * (tau - 1) / 2) / f,
          "share_heat": (A * (tau - 1) + A * (ss - 1) * (tau - 1) / 2) / f}
    check(dev, "days", 365.0)
    check(dev, "efc", 0.0)
    check(dev, "max_depth_pct", 0.0)
    check(dev, "charge_ah", 0.0)
    check(dev, "hours_near_full", 365 * 24.0 if s >= 0.95 else 0.0)
    check(dev, "hours_hot", 0.0)
    check(dev, "damage", f)
    check(dev, "fade_pct", 100 * L(f))
    check(dev, "soh_pct", 100 * (1 - L(f)))
    for k, v in sh.items():
        check(dev, k, v, rel=0, absol=1e-9)
    tot = sum(float(rows[dev][k]) for k in sh)
    ok = abs(tot - 1) <= 1e-9
    print("%s %s shares add up to %.15g" % ("ok  " if ok else "FAIL", dev, tot))
    bad += not ok
    check(dev, "days_to_eol", max(f_eol - f, 0) / (f / t) / 86400)
    best = max([("high-soc", sh["share_high_soc"]), ("heat", sh["share_heat"])],
               key=lambda x: x[1])
    dom = best[0] if best[1] >= 0.25 else "none"
    ok = rows[dev]["dominant"] == dom and rows[dev]["prior"] == "new"
    print("%s %s dominant: got %r, want %r" % ("ok  " if ok else "FAIL", dev, rows[dev]["dominant"], dom))
    bad += not ok
# Packs in service.
f = k_t * t
f0 = brentq(lambda x: L(x) - 0.10, 0.0, 5.0, xtol=1e-15)
check("S90", "damage_prior", f0, rel=1e-9)
check("S90", "fade_pct", 100 * (L(f0 + f) - L(f0)), rel=1e-7)
check("S90", "soh_pct", 100 * (1 - L(f0 + f)), rel=1e-9)
check("S90", "days_to_eol", (f_eol - f0 - f) / (f / t) / 86400, rel=1e-7)
check("NEW", "damage_prior", 0.0)
check("NEW", "fade_pct", 100 * L(f))
for dev, pr in (("S90", "soh"), ("A365", "age"), ("NEW", "new")):
    ok = rows[dev]["prior"] == pr
    print("%s %s prior: got %r, want %r" % ("ok  " if ok else "FAIL", dev, rows[dev]["prior"], pr))
    bad += not ok
# A365 rated to 500 cycles: the cycle damage is scaled so that 500 full
# cycles at reference reach f20; the calendar term is not scaled.
f0 = k_t * 365 * 86400 + 200 * f_eol / 500
def check_r(col, want, rel=1e-7):
    global bad
    got = float(rated["A365"][col])
    ok = abs(got - want) <= rel * abs(want)
    print("%s A365 rated %s: got %r, want %r" % ("ok  " if ok else "FAIL", col, got, want))
    bad += not ok
check_r("damage_prior", f0, rel=1e-9)
check_r("fade_pct", 100 * (L(f0 + f) - L(f0)))
check_r("soh_pct", 100 * (1 - L(f0 + f)), rel=1e-9)
# The year's fade of a pack at SoH 90 % is far below a new pack's (the
# film's early loss is behind it): about 1.2 points against 5.8.
print("S90 fade %.4f points in a year, a new pack %.4f" % (
    float(rows["S90"]["fade_pct"]), float(rows["NEW"]["fade_pct"])))
# The published model at the reference point: about 5.8 % fade in a year
# of rest (worked by hand from the equations: f = 0.013056).
check("P25", "fade_pct", 5.79, rel=2e-3)
sys.exit(1 if bad else 0)
PY
