# ASTM E1049-85 (reapproved 2017), 5.4.4, the worked example of its Fig. 6:
# the history -2, 1, -3, 5, -1, 3, -4, 4, -2 gives ranges 3, 4, 6, 8, 9
# with 0.5, 1.5, 0.5, 1.0, 0.5 cycles (4 cycles in all).  Per cycle:
# E-F (-1..3) closes as a full cycle when G (-4) is confirmed; A-B, B-C,
# C-D are the start-point halves, D-G, G-H, H-I the residue.
# The standard has no hysteresis: 0 and 1 (all reversals here are >= 3)
# give the same.  Points A..I one minute apart.
# source: standard ASTM E1049-85 (reapproved 2017), 5.4.4, the worked example
#   of Fig. 6
f=$TMPDIR_CASE/fig6.csv
printf 'device,time,soc_pct\n' >"$f"
i=0
for x in -2 1 -3 5 -1 3 -4 4 -2; do
	printf 'FIG6,2026-01-01T00:0%d:00Z,%s\n' $i $x >>"$f"
	i=$((i + 1))
done
cw-rainflow --hysteresis 0 "$f"
echo "-- cycles by range (the standard's table):"
cw-rainflow --hysteresis 0 "$f" |
    awk -F, 'NR > 1 { c[$2] += $4 } END { for (r in c) print r, c[r] }' |
    sort -n
cw-rainflow --hysteresis 0 "$f" >"$TMPDIR_CASE/h0.csv"
cw-rainflow "$f" | cmp - "$TMPDIR_CASE/h0.csv" && echo "hysteresis 1: same"
cw-rainflow -s "$f"
