#!/bin/sh
# cw-dcir's state through GNU parallel (the map: one state per day file
# with --state-out, on every core) and --merge (the reduce), and night by
# night with --state, against one pass over the whole history: the same
# trend and the same state, byte for byte; the step rows of the nights
# end to end are those of one pass.  Six summer days of six invented
# packs (cw-synth, no faults), cleaned day by day; --soc auto, and
# --max-points 64 (with a fixed gate, so that thinning goes through
# several levels) and 2048.  Source of "right": one pass over the
# concatenated days, as cw-dcir(1) promises.
set -eu
command -v parallel >/dev/null 2>&1 || { echo "GNU parallel not installed"; exit 77; }
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 6 -d 6 -s 7 -S 2026-07-13 -F none --aging 10 --mix 0,1,1,0 \
    -o "$tmp/in" >/dev/null
for f in "$tmp"/in/*.a.csv.gz; do
	b=$(basename "$f" .a.csv.gz)
	cw-clean --charge-negative --cells 10 -o "$tmp/$b.csv" "$f"
done
{ head -n 1 "$tmp/2026-07-13.csv"
  for f in "$tmp"/2026-07-1*.csv; do tail -n +2 "$f"; done; } >"$tmp/all.csv"
fail=0
for O in "--soc auto --min-span 2d" "--soc 10,100 --min-span 2d --max-points 64" \
    "--soc auto --min-span 2d --max-points 64"; do
	cw-dcir -t $O "$tmp/all.csv" >"$tmp/one.t"
	cw-dcir $O "$tmp/all.csv" | tail -n +2 >"$tmp/one.s"
	cw-dcir --state-out $O "$tmp/all.csv" >"$tmp/one.state"
	rm -f "$tmp"/*.state.d "$tmp/st"
	: >"$tmp/nights.s"
	for f in "$tmp"/2026-07-1*.csv; do
		cw-dcir $O --state "$tmp/st" "$f" | tail -n +2 >>"$tmp/nights.s"
	done
	parallel "cw-dcir --state-out $O -o {}.state.d {}" ::: \
	    "$tmp"/2026-07-1*.csv
	cw-dcir --merge $O "$tmp"/*.state.d >"$tmp/m.t"
	cw-dcir --merge --state-out $O "$tmp"/*.state.d >"$tmp/m.state"
	level=$(awk -F, 'NR == 2 { print $20 }' "$tmp/one.state")
	steps=$(wc -l <"$tmp/one.s")
	for x in nights.s:one.s:steps-night-by-night \
	    st:one.state:state-night-by-night m.t:one.t:trend-merged \
	    m.state:one.state:state-merged; do
		a=${x%%:*} r=${x#*:}
		b=${r%%:*} what=${r#*:}
		if cmp -s "$tmp/$a" "$tmp/$b"; then
			echo "ok   $O: $what as one pass"
		else
			echo "FAIL $O: $what differs from one pass"
			fail=$((fail + 1))
		fi
	done
	echo "     ($steps steps; first device thinned at level $level)"
done
echo "$fail failed"
[ "$fail" -eq 0 ]
