# dominant for packs built to be dominated by each stressor (SPEC.md
# cw-wear): 30 days, a row every 10 minutes.
#   CYC   full cycles 0-100 % every 4 h at 25 C        -> cycling
#   FULL  at rest at 100 % SoC, 25 C                  -> high-soc
#   HOT   at rest at 50 %, 40 C                       -> heat
#   COLD  cycles 20-80 % at 25 C but charged at 5 C,  -> cold-charge
#         overriding the model (no plating term)
#   COOL  at rest at 50 %, 20 C: slower than rest at  -> none
#         25 C and 50 %
#   EDGE2 charging at 25 C with 2 % of its charge   -> cold-charge
#         taken at 9.9 C (the rule is >= 2 %): 50 rows of 60 A for
#         60 s, exactly 1 Ah each, the last one cold
#   EDGE1 the same with 51 rows, 1.96 % cold          -> not cold-charge
# source: hand (Xu et al. 2018, constants as in lib/xu2018.c and
# tests/ref/wear_calendar_xu2018.sh).  Charge: CYC 5 A for 2 h of every
# 4 h, 180 cycles: 1800 Ah; COLD 3 A likewise, all at 5 C: 1080 Ah cold.
# FULL: share_high_soc = 1 - 1/S_s(1) = 1 - exp(-1.04 * 0.5) =
# 0.405479452.  HOT: share_heat = 1 - 1/S_T(40 C) = 1 - exp(-0.0693 * 15 *
# 298.15 / 313.15) = 0.6283146323.  COOL: S_T(20 C) < 1, capped: 0, none.
# CYC, in /usr/bin/python3 (the SoC as awk's %g prints it; 180 cycles of
# depth 1 at mean 0.5 and 25 C; calendar by the trapezoid rule):
#   Ss = lambda s: math.exp(1.04 * (s - 0.5)); kt = 4.14e-10
#   s = [float('%g' % (k % 24 * 100 / 12 if k % 24 < 12 else
#       (24 - k % 24) * 100 / 12)) / 100 for k in range(30 * 144 + 1)]
#   cal = kt * sum(300 * (Ss(a) + Ss(b)) for a, b in zip(s, s[1:]))
#   calc = kt * sum(300 * (min(Ss(a), 1) + min(Ss(b), 1)) for a, b in
#       zip(s, s[1:]))
#   cyc = 180 / (1.40e5 - 1.23e5); f = cyc + cal
#   cyc / f = 0.9041239328, (f - cyc - calc) / f = 0.01431324587
# The shares of COLD, EDGE1 and EDGE2 are snapshot (their cycles' mean
# temperature and residue halves are not worked here); their charge and
# dominant are worked above.
awk 'BEGIN {
	print "device,time,current_a,temp_c,soc_pct"
	for (k = 0; k <= 30 * 144; k++) {
		t = 1767225600 + 600 * k
		p = k % 24; up = p < 12
		s = up ? p * 100 / 12 : (24 - p) * 100 / 12
		printf "CYC,%d,%s,25,%g\n", t, up ? 5 : -5, s
		printf "FULL,%d,0,25,100\n", t
		printf "HOT,%d,0,40,50\n", t
		s = up ? 20 + p * 5 : 20 + (24 - p) * 5
		printf "COLD,%d,%s,%s,%g\n", t, up ? 3 : -3, up ? 5 : 25, s
		printf "COOL,%d,0,20,50\n", t
	}
	for (n = 50; n <= 51; n++)
		for (j = 0; j <= n; j++)
			printf "%s,%d,60,%s,%d\n", n == 50 ? "EDGE2" : "EDGE1",
			    1767225600 + 60 * j,
			    j == n ? 9.9 : 25, 20 + j
}' >"$TMPDIR_CASE/in.csv"
cw-wear "$TMPDIR_CASE/in.csv" | cut -d, -f1,10,5,13-15,18
