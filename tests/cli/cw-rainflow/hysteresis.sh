# Hysteresis: reversals smaller than X are ignored (SPEC.md).
# EB-0101's gauge wobbles 60 -> 60.5 -> 55: a reversal of 0.5, ignored by
# the default 1, a cycle of 0.5 (mean 60.25) with --hysteresis 0.1.
# source: hand
cw-rainflow testdata/rainflow-fleet.csv | grep -c '^EB-0101,0.5,'
cw-rainflow --hysteresis 0.1 testdata/rainflow-fleet.csv | grep '^EB-0101,0.5,'
# A reversal of exactly X counts (it is not smaller): 0, 10, 9, 11, 0.
# With X = 1 the 10-9 cycle is closed (X = 2 >= Y = 1); with 1.5 it is
# ignored and 0, 11, 0 is left.  In tenths: 50.3 -> 49.3 is exactly 1.
# (11-0 is one full cycle: 0 -> 11 -> 0 are two start-point halves of the
# same range and mean, written as the one cycle they make.)
f=$TMPDIR_CASE/h.csv
printf 'device,time,soc_pct\n' >"$f"
i=0
for x in 0 10 9 11 0 50.3 49.3 60 40; do
	printf 'H,%d,%s\n' $((1772431200 + 60 * i)) $x >>"$f"
	i=$((i + 1))
done
echo "-- hysteresis 1:"
cw-rainflow --hysteresis 1 "$f"
echo "-- hysteresis 1.5:"
cw-rainflow --hysteresis 1.5 "$f"
