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
