# --max-points is an upper bound even when a device's steps fall in more
# SoC bins than N (testdata/dcir-fleet.csv: CART-03 has steps in 20 bins,
# EB-0042 in 19; --max-points 16).  Before the SoC bins merged, the
# thinning stopped at one point per bin, and fit_steps was 20 and 19.
# The count is checked against the documented rule, worked by awk from
# the step rows: the whole history is one bucket at these levels, and at
# level 40 + K the bins are int(SoC) / 2^K; the first K (1..7) whose
# distinct bins number at most 16 gives the points kept.
# source: hand (the rule of cw-dcir(1), Trend, worked by awk in the case)
cw-dcir -t --soc 0,100 --max-points 16 testdata/dcir-fleet.csv | cut -d, -f1,2,10
cw-dcir -t --soc 0,100 --max-points 16 testdata/dcir-fleet.csv |
    awk -F, 'NR > 1 && $10 != "" { print $1 "," $10 }' >"$TMPDIR_CASE/t"
cw-dcir --soc 0,100 testdata/dcir-fleet.csv | awk -F, '
NR > 1 { b = int($3); if (b > 99) b = 99; bin[$1, b] = 1; dev[$1]++ }
END {
	for (d in dev) {
		if (dev[d] < 10)
			continue	# no fit under the default 10 steps
		m = 0
		for (b = 0; b < 100; b++) m += (d SUBSEP b) in bin
		for (k = 0; m > 16 && k < 7; ) {
			k++; m = 0; split("", g)
			for (b = 0; b < 100; b++)
				if ((d SUBSEP b) in bin && !(int(b / 2 ^ k) in g)) {
					g[int(b / 2 ^ k)] = 1; m++
				}
		}
		print d "," m | "sort"
	}
}' >"$TMPDIR_CASE/a"
cat "$TMPDIR_CASE/a"
cmp "$TMPDIR_CASE/t" "$TMPDIR_CASE/a" && echo "fit_steps as worked out by awk, at most 16"
