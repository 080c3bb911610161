# --state night by night equals one pass (testdata/dcir-fleet.csv cut
# into five pieces at row boundaries, steps straddling the cuts
# included; --max-points 16 so that the thinning is at work): the same
# step rows, the same trend, the same state bytes; the same through
# --state-out per piece and --merge, files in any order or a sorted
# stream.  Then states refused (exit 1): cut short, one digit changed,
# another version, other settings, the same piece twice.
# source: spec
d=$TMPDIR_CASE
f=testdata/dcir-fleet.csv
O="--soc auto --max-points 16"
n=$(($(wc -l <"$f") - 1))
for k in 1 2 3 4 5; do
	{ head -n 1 "$f"
	  tail -n +2 "$f" | sed -n "$(( (k - 1) * n / 5 + 1 )),$(( k * n / 5 ))p"
	} >"$d/p$k.csv"
done
cw-dcir $O "$f" >"$d/one.s"
cw-dcir -t $O "$f" >"$d/one.t"
cw-dcir --state-out $O "$f" >"$d/one.state"
head -n 1 "$d/one.s" >"$d/nights.s"
for k in 1 2 3 4 5; do
	cw-dcir $O --state "$d/st" "$d/p$k.csv" | tail -n +2 >>"$d/nights.s"
	echo "night $k rc $?"
done
cmp "$d/one.s" "$d/nights.s" && echo "steps: night by night as one pass"
cmp "$d/one.state" "$d/st" && echo "state: night by night as one pass"
cw-dcir -t $O --state "$d/st" /dev/null | cmp "$d/one.t" - &&
    echo "trend: night by night as one pass"
for k in 1 2 3 4 5; do
	cw-dcir --state-out $O -o "$d/p$k.state" "$d/p$k.csv"
done
cw-dcir --merge $O "$d"/p5.state "$d"/p2.state "$d"/p1.state \
    "$d"/p4.state "$d"/p3.state | cmp "$d/one.t" - &&
    echo "trend: merged as one pass"
cat "$d"/p*.state | sort -t, -k1,1 | cw-dcir --merge --state-out $O |
    cmp "$d/one.state" - && echo "state: a sorted stream merged as one pass"
head -n 2 "$d/one.state" | cut -d, -f1-20
# Refused.
try() {
	cw-dcir "$@" >/dev/null 2>"$d/err"
	rc=$?
	sed "s|$d/||" "$d/err"
	echo "rc $rc"
}
head -c 2000 "$d/one.state" >"$d/cut.state"
try -t $O --state "$d/cut.state" /dev/null
head -n 3 "$d/one.state" >"$d/lines.state"
try -t $O --merge "$d/lines.state"
sed '2s/,2026-/,2027-/' "$d/one.state" >"$d/digit.state"
try -t $O --state "$d/digit.state" /dev/null
sed 's/cw-dcir-state-1/cw-dcir-state-9/' "$d/one.state" >"$d/v9.state"
try -t $O --state "$d/v9.state" /dev/null
cp "$d/one.state" "$d/copy.state"
try -t --soc 20,80 --max-points 16 --state "$d/copy.state" /dev/null
try -t $O --ea 35 --state "$d/copy.state" /dev/null
cmp "$d/one.state" "$d/copy.state" && echo "state left as it was"
try -t $O --merge "$d/p1.state" "$d/p1.state"
try -t $O --merge "$f"
try $O --state "$d/x" -o "$d/x" "$f"
