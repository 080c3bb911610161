# Usage errors exit 2 with a message naming the option; nothing is made.
# source: spec
for args in "-x" "--days 0" "--days 2.5" "-n abc" "--period 7" \
    "--period 1.5" "--period 2h" "--start 2026-02-30" "--start 26-01-01" \
    "--faults dupe=1" "--faults dup=2" "--faults dup=0.6,trunc=0.5" \
    "--faults gap" "--mix 0,0,0,0" "--mix 1,2,3" "--mix 1,-1,1,1" \
    "--tz 25:00" "-z 10" "--seed -1" "--seed 18446744073709551616" \
    "--aging -1" "-f c" "-o $TMPDIR_CASE/x extra"; do
	cw-synth -o "$TMPDIR_CASE/x" $args 2>&1
	echo "rc=$? for $args" | sed "s|$TMPDIR_CASE|TMP|"
done
ls "$TMPDIR_CASE"
