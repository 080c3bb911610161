# --charge-sign auto on a short file: 12 rows of a pack charged at -5 C
# whose log counts charging negative (-2 A while the voltage rises 5 mV a
# row), no SoC.  11 intervals against the change of voltage, none with
# it: fewer than the 20 that turn a file, so it is taken as positive, but
# a warning says so without -v (at least 5 against, four times as many
# as with).  Given --charge-sign negative, the charge is positive.
# source: hand: 11 intervals, rules of cw-clean(1), charge-sign
{
	echo device,time,voltage_v,current_a,temp_c
	for k in 0 1 2 3 4 5 6 7 8 9 10 11; do
		printf 'R1,2026-01-10T06:%02d:00Z,%.3f,-2,-5\n' "$k" \
		    "$(echo "3.600 + $k * 0.005" | bc)"
	done
} >"$TMPDIR_CASE/short.csv"
cw-clean "$TMPDIR_CASE/short.csv" 2>&1 >/dev/null |
    sed "s|$TMPDIR_CASE/||"
cw-clean --charge-sign negative "$TMPDIR_CASE/short.csv" | sed -n 2p
