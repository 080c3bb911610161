# Usage errors exit 2, never read a bad value as 0: a bad number, a bad
# duration, an unknown option, a missing argument, a bad -c spec.  Each
# line shows the exit status; the messages are in the .err file.
# source: spec
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nA,1,3.8,1\n' >a.csv
for args in "--cells x" "--cells 1e3x" "--full-voltage 4.2V" \
    "--soc-from-charge nan" "--max-reject inf" "--max-reject -0.1" \
    "--step 5q" "--step -60" "--reorder 1h30m" "--max-gap 15min" \
    "--bogus" "-q" "-c time" "-c time=" "-c volts=u" "-c voltage=u:kV" \
    "-d ab" "--tz 0100" "-c" "--device" "-d" "-o"; do
	# Options after the file name, so that the last ones lack their
	# argument (getopt_long takes options anywhere).
	cw-clean a.csv $args >/dev/null
	echo "$args: rc=$?"
done
