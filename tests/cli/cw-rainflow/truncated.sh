# A truncated gzip input is a data error (exit 1) naming the file.  The
# rows already written to standard output stay valid CSV, the residue is
# not counted from a history known to be cut short, and with -o the file
# is not put in place.
# source: spec
f=$TMPDIR_CASE/t.csv
printf 'device,time,soc_pct\n' >"$f"
i=0
while [ $i -lt 4000 ]; do
	printf 'A,%d,%d\n' $((1772431200 + 60 * i)) $(( (i % 7) * 10 + (i % 3) * 5 )) >>"$f"
	i=$((i + 1))
done
gzip -c "$f" | head -c 6000 >"$TMPDIR_CASE/t.csv.gz"
cw-rainflow "$TMPDIR_CASE/t.csv.gz" >"$TMPDIR_CASE/out.csv" 2>"$TMPDIR_CASE/err"
echo "rc=$?"
sed "s|$TMPDIR_CASE/||" "$TMPDIR_CASE/err"
head -n 1 "$TMPDIR_CASE/out.csv"
awk -F, 'NR > 1 && (NF != 7 || $4 != 1) { bad++ } END { print NR - 1,
    "rows,", bad + 0, "not whole full cycles" }' "$TMPDIR_CASE/out.csv"
cw-rainflow -o "$TMPDIR_CASE/o.csv" "$TMPDIR_CASE/t.csv.gz" 2>/dev/null
echo "rc=$?"
ls "$TMPDIR_CASE"
