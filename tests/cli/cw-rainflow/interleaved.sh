# Devices interleaved in one stream count as each device alone: every
# device's rows, cut out into a file of their own, give the same rows
# (per cycle, and summary) as that device's rows of the whole stream.
# source: spec (each device alone equals its rows of the whole stream; no
#   number to derive)
f=testdata/rainflow-fleet.csv
cw-rainflow "$f" >"$TMPDIR_CASE/all.csv"
cw-rainflow -s "$f" >"$TMPDIR_CASE/alls.csv"
for d in CT-0305 EB-0101 SC-0203; do
	{ head -n 1 "$f"; grep "^$d," "$f"; } >"$TMPDIR_CASE/$d.csv"
	cw-rainflow "$TMPDIR_CASE/$d.csv" | grep "^$d," >"$TMPDIR_CASE/one.csv"
	grep "^$d," "$TMPDIR_CASE/all.csv" | cmp - "$TMPDIR_CASE/one.csv" &&
	    echo "$d: $(wc -l <"$TMPDIR_CASE/one.csv") cycle rows, same alone"
	cw-rainflow -s "$TMPDIR_CASE/$d.csv" | grep "^$d," >"$TMPDIR_CASE/s1.csv"
	grep "^$d," "$TMPDIR_CASE/alls.csv" | cmp - "$TMPDIR_CASE/s1.csv" &&
	    echo "$d: summary same alone"
done
