# States that are cut short, damaged, of another version, made with other
# settings or overlapping are refused (exit 1) and never taken for an
# empty state; the --state file is left as it was.
# source: spec
f=testdata/wear-fleet.csv
d=$TMPDIR_CASE
cw-wear --state "$d/good.state" "$f" 2>&1 >/dev/null | sed "s|$d/||" >&2
cp "$d/good.state" "$d/copy.state"
# Run cw-wear, show its messages without the scratch folder, its status.
try() {
	cw-wear "$@" >/dev/null 2>"$d/err"
	rc=$?
	sed "s|$d/||" "$d/err"
	echo "rc $rc"
}
# Cut mid-write, at a line end, and empty.
head -c 3000 "$d/good.state" >"$d/cut.state"
try --state "$d/cut.state" "$f"
head -n 3 "$d/good.state" >"$d/lines.state"
try --state "$d/lines.state" "$f"
: >"$d/empty.state"
try --state "$d/empty.state" "$f"
cmp "$d/empty.state" /dev/null && echo "empty file left as it was"
# One digit changed.
sed '2s/,1,/,2,/' "$d/good.state" >"$d/digit.state"
try --state "$d/digit.state" "$f"
# Another version: a later one, and version 1 (refused with what to do).
sed 's/cw-wear-state-2/cw-wear-state-3/' "$d/good.state" >"$d/v2.state"
try --state "$d/v2.state" "$f"
sed 's/cw-wear-state-2/cw-wear-state-1/' "$d/good.state" >"$d/v2.state"
try --state "$d/v2.state" "$f"
# Other settings than the state's.
try --state "$d/copy.state" --hysteresis 2 "$f"
try --state "$d/copy.state" --max-gap 30m "$f"
try --state "$d/copy.state" --limits 0,5,45,60 "$f"
cmp "$d/good.state" "$d/copy.state" && echo "state left as it was"
# Samples are not states; states are not samples.
try --merge "$f"
try "$d/good.state"
# The same stretch twice.
cw-wear --state-out "$f" >"$d/all.state"
try --merge "$d/all.state" "$d/all.state"
cat "$d/all.state" "$d/all.state" | cw-wear --merge >/dev/null
echo "rc $?"
# Out of time order: the last day, the first, then the one between.
for k in 2 3 4; do
	awk -F, -v k=$k 'NR == 1 || substr($2, 10, 1) == k' "$f" |
	    cw-wear --state-out >"$d/d$k.state"
done
try --merge "$d/d4.state" "$d/d2.state" "$d/d3.state"
cw-wear --merge "$d/d2.state" "$d/d3.state" "$d/d4.state" >"$d/ordered.csv"
cw-wear "$f" | cmp - "$d/ordered.csv" && echo "in time order: one pass"
cat "$d/d4.state" "$d/d2.state" "$d/d3.state" | sort -t, -k1,1 |
    cw-wear --merge | cmp - "$d/ordered.csv" && echo "sorted: one pass"
# Grouped by device but in any time order within it (a stable sort on the
# device alone, as a reducer may get them): gathered, then joined in order.
cat "$d/d4.state" "$d/d2.state" "$d/d3.state" | sort -s -t, -k1,1 |
    cw-wear --merge | cmp - "$d/ordered.csv" && echo "grouped: one pass"
# A sorted state saved to a file (its end rows first) reads whole, and is
# found cut short when rows of it are lost.
cat "$d/d2.state" "$d/d3.state" "$d/d4.state" | sort -t, -k1,1 \
    >"$d/sorted.state"
cw-wear --merge "$d/sorted.state" | cmp - "$d/ordered.csv" &&
    echo "sorted file: one pass"
grep -v '^TOOL-33,' "$d/sorted.state" >"$d/lost.state"
try --merge "$d/lost.state"
# Usage.
cw-wear --state - "$f"
echo "rc $?"
cw-wear --state "$d/x" -o "$d/x" "$f"
echo "rc $?"
