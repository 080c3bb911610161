# A stream without the signal column is an error naming the column
# (exit 1); so is one without device or time.  Nothing but the header
# was written.
# source: spec
printf 'device,time,voltage_v\nA,0,3.7\n' | cw-rainflow
echo "rc=$?"
printf 'device,time,soc_pct\nA,0,50\n' | cw-rainflow --signal cell_mv
echo "rc=$?"
printf 'time,soc_pct\n0,50\n' | cw-rainflow -s
echo "rc=$?"
# The same with -o: the output file is not created.
printf 'device,time\nA,0\n' | cw-rainflow -o "$TMPDIR_CASE/out.csv"
echo "rc=$?"
ls "$TMPDIR_CASE"
