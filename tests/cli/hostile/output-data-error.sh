# -o FILE never leaves a partial file (SPEC.md: written atomically): a
# run that fails on a data error (a truncated gzip input), an input that
# cannot be opened, or a required column missing keeps the old FILE
# byte for byte, and its temporary (.FILE.tmpXXXXXX beside it) is gone.
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN { print "device,time,voltage_v,current_a,temp_c,soc_pct"
	for (k = 0; k < 4000; k++)
		printf "EB-%02d,%d,%.3f,%.2f,%.1f,%.1f\n", k % 5,
		    1772323200 + 10 * k, 3.6 + (k % 50) / 100,
		    (k % 40 < 20) ? 2.5 : -3, 5 + k % 50, 20 + (k % 60) }' |
    gzip -c >full.csv.gz
head -c $(($(wc -c <full.csv.gz) * 2 / 3)) full.csv.gz >cut.csv.gz
printf 'time,voltage_v,current_a,soc_pct\n1,3.7,1,50\n' >nocolumns.csv
for t in $TOOLS; do
	for input in cut.csv.gz missing.csv nocolumns.csv; do
		echo "the result of an earlier good run" >res.csv
		"$t" -o res.csv "$input" >stdout.txt
		rc=$?
		echo "$t -o res.csv $input: exit $rc," \
		    "old file kept: $(echo "the result of an earlier good run" |
		    cmp -s - res.csv && echo yes || echo NO)," \
		    "temporaries left: $(ls -a | grep -c '^\.res\.csv\.tmp')," \
		    "stdout: $(wc -c <stdout.txt | tr -d ' ') bytes"
	done
done
# And a good run does replace it.
cw-rainflow -o res.csv full.csv.gz
echo "a good run: exit $?, $(wc -l <res.csv | tr -d ' ') lines in res.csv"
