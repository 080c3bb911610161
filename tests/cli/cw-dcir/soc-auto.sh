# cw-dcir(1) EXAMPLES: --soc auto, each pack's trend in the 30-point SoC
# window holding most of its steps (testdata/dcir-fleet.csv; the trend's
# values are a snapshot).  The window is checked against the documented
# rule worked out by awk from the rows of steps (which with --soc auto
# list every step at any SoC): for each LO in 0..70 the steps with
# LO <= SoC < LO + 30 (100 in 70..100), the most, ties to the window
# whose middle is nearest 50, then the lower; awk prints LO-HI and the
# count, which must equal soc_gate and steps of the trend.
# source: hand (the window by the documented rule, worked by awk in the case; the trend values snapshot)
cw-dcir -t --soc auto testdata/dcir-fleet.csv
cw-dcir -t --soc auto testdata/dcir-fleet.csv | cut -d, -f1,2,14 >"$TMPDIR_CASE/t"
cw-dcir --soc auto testdata/dcir-fleet.csv | awk -F, '
NR > 1 { b = int($3); if (b > 99) b = 99; n[$1, b]++; dev[$1] = 1 }
END {
	print "device,steps,soc_gate"
	for (d in dev) {
		best = -1
		for (lo = 0; lo <= 70; lo++) {
			c = 0
			for (k = lo; k < lo + 30; k++) c += n[d, k]
			dist = 2 * lo + 30 - 100; if (dist < 0) dist = -dist
			if (c > best || (c == best && dist < bd)) {
				best = c; blo = lo; bd = dist
			}
		}
		printf "%s,%d,%d-%d\n", d, best, blo, blo + 30 | "sort"
	}
}' >"$TMPDIR_CASE/a"
cmp "$TMPDIR_CASE/t" "$TMPDIR_CASE/a" && echo "soc_gate and steps as worked out by awk"
# The default gate for comparison, and the step rows' counts.
cw-dcir -t testdata/dcir-fleet.csv | cut -d, -f1,2,14
cw-dcir --soc auto testdata/dcir-fleet.csv | wc -l
cw-dcir testdata/dcir-fleet.csv | wc -l
cw-dcir --soc autox testdata/dcir-fleet.csv; echo "rc $?"
