# SIGTERM or SIGINT in the middle of a run with -o FILE: the tool dies of
# the signal (exit 128 + signal), the old FILE is kept and the temporary
# removed.  The input is a FIFO this script holds open, so the tool is
# certainly mid-run (it has read rows and waits for more) when the signal
# comes; the script waits until the temporary exists before sending it.
# cli: no-valgrind
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN { print "device,time,voltage_v,current_a,temp_c,soc_pct"
	for (k = 0; k < 2000; k++)
		printf "EB-%02d,%d,%.3f,%.2f,%.1f,%.1f\n", k % 5,
		    1772323200 + 10 * k, 3.6 + (k % 50) / 100,
		    (k % 40 < 20) ? 2.5 : -3, 5 + k % 50, 20 + (k % 60) }' \
    >rows.csv
for t in $TOOLS; do
	for sig in TERM INT; do
		echo "the result of an earlier good run" >res.csv
		rm -f in.fifo
		mkfifo in.fifo
		"$t" -o res.csv in.fifo &
		pid=$!
		exec 3>in.fifo
		cat rows.csv >&3
		n=0
		while [ -z "$(ls -a | grep '^\.res\.csv\.tmp')" ] &&
		    [ $n -lt 300 ]; do
			sleep 0.1
			n=$((n + 1))
		done
		had=$(ls -a | grep -c '^\.res\.csv\.tmp')
		kill -$sig $pid
		wait $pid 2>/dev/null
		rc=$?
		exec 3>&-
		echo "$t killed by SIG$sig: exit $rc, temporary seen before:" \
		    "$had, old file kept: $(echo "the result of an earlier" \
		    "good run" | cmp -s - res.csv && echo yes || echo NO)," \
		    "temporaries left: $(ls -a | grep -c '^\.res\.csv\.tmp')"
	done
done
