# --residue on the ASTM E1049-85 Fig. 6 history (-2, 1, -3, 5, -1, 3, -4,
# 4, -2).  full: the six open ranges (3, 4, 8, 9, 8, 6) count 1 each, 7
# cycles.  repeat, by hand: the period -2, 1, -3, 5, -1, 3, -4, 4 (the
# last -2 meets the first) rotated to its maximum, 5, -1, 3, -4, 4, -2,
# 1, -3, 5, closes -1/3 (4), -2/1 (3), 4/-3 (7) and 5/-4 (9): 4 full
# cycles, half the 8 turning points of a period.
# source: standard ASTM E1049-85 Fig. 6 history; the full and repeat residues
#   worked by hand below
f=$TMPDIR_CASE/fig6.csv
printf 'device,time,soc_pct\n' >"$f"
i=0
for x in -2 1 -3 5 -1 3 -4 4 -2; do
	printf 'FIG6,2026-01-01T00:0%d:00Z,%s\n' $i $x >>"$f"
	i=$((i + 1))
done
for m in half full repeat; do
	echo "-- $m"
	cw-rainflow --residue $m "$f"
	cw-rainflow --residue $m -s "$f" | tail -n 1
done
