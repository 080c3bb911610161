# Two runs on one --state at once (cron started the next night while the
# last still ran).  Run A holds the state while it reads its day from a
# FIFO this case writes to; a run with --lock-wait 0 is refused (exit 1,
# the state byte for byte as it was); run C, waiting (the default), goes
# on once A has renamed its state into place, so the state ends with both
# nights: byte for byte the one of three runs one after the other, and
# C's report that of one pass over the three days.
# source: spec
f=testdata/wear-fleet.csv
d=$TMPDIR_CASE
for k in 2 3 4; do
	awk -F, -v k=$k 'NR == 1 || substr($2, 10, 1) == k' "$f" >"$d/d$k.csv"
done
# The three nights one after the other, for comparison.
for k in 2 3 4; do
	cw-wear --state "$d/seq.state" "$d/d$k.csv" >/dev/null 2>&1 || echo "seq $k"
done
cw-wear --state "$d/s.state" "$d/d2.csv" >/dev/null 2>/dev/null
cp "$d/s.state" "$d/night2.state"
mkfifo "$d/fifo"
cw-wear --state "$d/s.state" "$d/fifo" >/dev/null 2>"$d/a.err" &
a=$!
# The open returns once A reads the FIFO, which it does with the lock.
exec 3>"$d/fifo"
cw-wear --lock-wait 0 --state "$d/s.state" "$d/d4.csv" >/dev/null \
    2>"$d/b.err" 3>&-
echo "refused: rc $?"
sed -e "s|$d/||g" -e 's/process [0-9]*/process PID/' "$d/b.err"
cmp "$d/s.state" "$d/night2.state" && echo "state left as it was"
# C waits; -v says so once, and only then does A get its day.
cw-wear -v --state "$d/s.state" "$d/d4.csv" >"$d/c.csv" 2>"$d/c.err" 3>&- &
c=$!
n=0
until grep -qs 'waiting for another run' "$d/c.err"; do
	n=$((n + 1))
	[ $n -gt 1200 ] && { echo "C never waited"; break; }
	sleep 0.05
done
cat "$d/d3.csv" >&3
exec 3>&-
wait $a
echo "A: rc $?"
cat "$d/a.err"
wait $c
echo "C: rc $?"
grep -c 'waiting for another run (process [0-9]*) to let go of .*s.state.lock' \
    "$d/c.err"
cmp "$d/s.state" "$d/seq.state" && echo "state = three nights in a row"
cw-wear "$f" | cmp - "$d/c.csv" && echo "C's report = one pass"
ls -a "$d" | grep 'tmp' || echo "no temporaries left"
