# Flat runs are not turning points; a held value counts once, at its
# first row.  0 (3 rows) -> 10 (3 rows) -> 0: two halves of 10, the peak
# at its first row (00:03), the final valley at its first row (00:06).
# The same history without the repeated rows gives the same rows.
# source: hand
f=$TMPDIR_CASE/p.csv
printf 'device,time,soc_pct\n' >"$f"
i=0
for x in 0 0 0 10 10 10 0 0; do
	printf 'P,2026-01-01T00:0%d:00Z,%s\n' $i $x >>"$f"
	i=$((i + 1))
done
cw-rainflow --hysteresis 0 "$f" | tee "$TMPDIR_CASE/p.out"
printf 'device,time,soc_pct\nP,2026-01-01T00:00:00Z,0\n%s\n%s\n' \
    P,2026-01-01T00:03:00Z,10 P,2026-01-01T00:06:00Z,0 |
    cw-rainflow --hysteresis 0 | cmp - "$TMPDIR_CASE/p.out" &&
    echo "without the flat rows: same"
# A constant history has no cycles: a summary row with 0 cycles.
printf 'device,time,soc_pct\nK,1772431200,42\nK,1772431260,42\n' | cw-rainflow -s
