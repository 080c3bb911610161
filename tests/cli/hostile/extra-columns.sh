# Every analysis tool passes unknown columns by: the same stream with
# extra columns (those cw-clean --keep carries after soc_pct: a dock, a
# quoted site holding a comma and a quote, an empty one; and one moved
# to the front, with the stream's own columns in another order) gives
# each tool's output byte for byte as without them.
# source: spec (SPEC "Common to every tool": columns found by header
#   name, in any order; unknown ones ignored)
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
for f in thermal-fleet wear-fleet dcir-fleet rainflow-fleet capacity-fleet \
    volt-fleet; do
	awk -F, 'BEGIN { OFS = "," }
	    NR == 1 { print $0, "dock", "site", "note"; next }
	    { print $0, "D-" NR % 3, "\"North, \"\"A\"\"\"", "" }' \
	    "$top/testdata/$f.csv" >"$f.keep.csv"
	# The extra column first, the stream's columns turned around.
	awk -F, 'BEGIN { OFS = "," }
	    { print (NR == 1 ? "dock" : "D-" NR % 3), $6, $5, $4, $3, $2, $1 }' \
	    "$top/testdata/$f.csv" >"$f.moved.csv"
done
run() {
	name=$1 data=$2
	shift 2
	"$@" "$top/testdata/$data.csv" >plain.out 2>plain.err
	rc=$?
	for v in keep moved; do
		"$@" "$data.$v.csv" >$v.out 2>$v.err
		if [ $? -eq $rc ] && cmp -s plain.out $v.out &&
		    cmp -s plain.err $v.err; then
			echo "$name ($v): same, $(wc -l <plain.out) lines, rc=$rc"
		else
			echo "$name ($v): DIFFERENT"
			diff plain.out $v.out | head -5
		fi
	done
}
run cw-thermal thermal-fleet cw-thermal
run "cw-thermal --summary" thermal-fleet cw-thermal --summary
run cw-wear wear-fleet cw-wear
run "cw-wear --dwell" wear-fleet cw-wear --dwell
run cw-dcir dcir-fleet cw-dcir
run "cw-dcir --trend" dcir-fleet cw-dcir --trend
run cw-rainflow rainflow-fleet cw-rainflow
run cw-topoff wear-fleet cw-topoff
run cw-capacity capacity-fleet cw-capacity
run cw-volt volt-fleet cw-volt --cells 10
