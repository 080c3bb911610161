#!/bin/sh
# make bench: how fast cellwear is next to its physical floors and to a
# pandas script doing the same cleaning.  Results go to stdout and to
# BENCHMARKS.md (or $BENCH_OUT).  Timing is never asserted: this reports.
#
#   scripts/bench.sh            the full run (5.2 million rows and more)
#   scripts/bench.sh --tiny     a few thousand rows, to keep the script
#                               working (make check runs this)
set -eu
top=$(cd "$(dirname "$0")/.." && pwd)
cd "$top"
PATH="$top/bin:$PATH"
export PATH LC_ALL=C

tiny=0
[ "${1:-}" = "--tiny" ] && tiny=1
out=${BENCH_OUT:-BENCHMARKS.md}
work=${BENCH_DIR:-$(mktemp -d /tmp/cw-bench.XXXXXX)}
reps=${BENCH_REPS:-3}
if [ $tiny -eq 1 ]; then
	devs=4 days=2 period=60 reps=1
else
	devs=${BENCH_DEVICES:-200} days=${BENCH_DAYS:-3} period=10
fi
trap 'rm -rf "$work"' EXIT
[ -n "${BENCH_NOBUILD:-}" ] || make -s all build/tests/floor_inflate build/tests/floor_csv
FA=build/tests/floor_inflate
FB=build/tests/floor_csv
CLEAN="cw-clean --cells 10 --charge-negative"

# t CMD...: run REPS times, print the median wall seconds and the largest
# peak resident set (KiB) as "SECONDS KIB".
t() {
	i=0
	: >"$work/times"
	while [ $i -lt "$reps" ]; do
		/usr/bin/time -f '%e %M' -o "$work/one" sh -c "$*" \
		    >/dev/null 2>"$work/stderr" || {
			echo "bench: failed: $*" >&2; cat "$work/stderr" >&2
			exit 1; }
		cat "$work/one" >>"$work/times"
		i=$((i + 1))
	done
	sort -n "$work/times" | awk '{ t[NR] = $1; if ($2 > m) m = $2 }
	    END { printf "%s %s\n", t[int((NR + 1) / 2)], m }'
}
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.2f", (b > 0 ? a / b : 0) }'; }
row() { printf '| %s | %s | %s | %s | %s |\n' "$1" "$2" "$3" "$4" "$5"; }

gen() {	# gen DIR DEVICES DAYS PERIOD
	rm -rf "$1"
	cw-synth -n "$2" -d "$3" -p "$4" -s 7 -o "$1" >/dev/null
}

gen "$work/fleet" $devs $days $period
files=$(ls "$work"/fleet/*.a.csv.gz | tr '\n' ' ')
rows=$(zcat $files | wc -l)
$CLEAN $files >"$work/stream.csv"
srows=$(wc -l <"$work/stream.csv")

# Alternate the contenders round by round so that drift in the machine's
# speed hits them all alike.
set -- \
    "floorA" "$FA $files" \
    "floorB" "$FB $files" \
    "clean60" "$CLEAN --step 60 $files" \
    "clean" "$CLEAN $files" \
    "floorBs" "$FB $work/stream.csv" \
    "rainflow" "cw-rainflow --summary $work/stream.csv" \
    "thermal" "cw-thermal $work/stream.csv" \
    "topoff" "cw-topoff $work/stream.csv" \
    "dcir" "cw-dcir --trend $work/stream.csv" \
    "capacity" "cw-capacity --trend $work/stream.csv" \
    "wear" "cw-wear $work/stream.csv"
results="$work/results"
: >"$results"
r=0
while [ $r -lt "$reps" ]; do
	n=1
	while [ $n -lt $# ]; do
		eval "name=\${$n}; cmd=\${$((n + 1))}"
		res=$(reps=1 t "$cmd")
		echo "$name $res" >>"$results"
		n=$((n + 2))
	done
	r=$((r + 1))
done
med() {	# med NAME: "SECONDS KIB" median over rounds, max memory
	awk -v k="$1" '$1 == k { print $2, $3 }' "$results" | sort -n |
	    awk '{ t[NR] = $1; if ($2 > m) m = $2 }
	    END { printf "%s %s\n", t[int((NR + 1) / 2)], m }'
}
set -- $(med floorA); fa=$1
set -- $(med floorB); fb=$1
set -- $(med floorBs); fbs=$1
set -- $(med clean60); c60=$1 c60m=$2
set -- $(med clean); c0=$1 c0m=$2

# pandas, the way a practitioner would write it.
pd=$(reps=1 t "/usr/bin/python3 scripts/bench_pandas.py $work/pd.csv $files")
pds=${pd% *}

# Scaling: rows x1, x2, x4 and devices x10 at the same row count.
scale() {	# scale LABEL DEVICES DAYS PERIOD
	gen "$work/s" "$2" "$3" "$4"
	sf=$(ls "$work"/s/*.a.csv.gz | tr '\n' ' ')
	sr=$(zcat $sf | wc -l)
	s1=$(reps=1 t "$CLEAN --step 60 $sf")
	$CLEAN $sf >"$work/s.csv"
	s2=$(reps=1 t "cw-wear $work/s.csv")
	echo "$1 $sr $s1 $s2"
}
if [ $tiny -eq 1 ]; then
	sc="$(scale x1 4 1 60)
$(scale x2 4 2 60)"
else
	sc="$(scale x1 $devs $days $period)
$(scale x2 $devs $((days * 2)) $period)
$(scale x4 $devs $((days * 4)) $period)
$(scale d10 $((devs * 10)) $days $((period * 10)))"
fi

# Memory at 10,000 devices (one day at 10 min): the 32 MiB target.
if [ $tiny -eq 1 ]; then nd=50; else nd=10000; fi
gen "$work/m" $nd 1 600
mf=$(ls "$work"/m/*.a.csv.gz | tr '\n' ' ')
$CLEAN $mf >"$work/m.csv"
mem=""
for k in "cw-clean --cells 10 --charge-negative --step 600 $mf" \
    "cw-rainflow --summary $work/m.csv" "cw-thermal $work/m.csv" \
    "cw-topoff $work/m.csv" "cw-dcir --trend $work/m.csv" \
    "cw-capacity --trend $work/m.csv" "cw-wear $work/m.csv"; do
	set -- $(reps=1 t "$k")
	mem="$mem| ${k%% *} | $2 |
"
done

# Two cores: GNU parallel over the day files.
mkdir -p "$work/par"
p1=$(reps=1 t "parallel -j1 '$CLEAN --step 60 {} > $work/par/{/.}.csv' ::: $files")
p2=$(reps=1 t "parallel -j2 '$CLEAN --step 60 {} > $work/par/{/.}.csv' ::: $files")
p1s=${p1% *} p2s=${p2% *}

# Instruction counts (valgrind --tool=callgrind): repeatable whatever else
# the machine is doing, over the first day file.
ir() {
	valgrind --tool=callgrind --callgrind-out-file=/dev/null "$@" \
	    2>&1 >/dev/null | sed -n 's/.*refs: *//p' | tr -d ,
}
first=${files%% *}
if command -v valgrind >/dev/null 2>&1; then
	irb=$(ir $FB $first)
	irc=$(ir $CLEAN --step 60 $first)
	irs="floor B $irb, cw-clean --step 60 $irc instructions: $(ratio "$irc" "$irb") x B"
else
	irs="valgrind not installed"
fi

# Projection: a 10,000-pack day at 10 s is 86.4 million rows.
set -- $(echo "$sc" | awk '$1 == "x4"' ) ; x4rows=${2:-0}
proj=$(echo "$sc" | awk -v c="$c60" -v rows="$rows" '
    END { r = rows / c; printf "%.0f", 86400000 / r }')

{
echo "# Benchmarks"
echo
echo "Run: \`make bench\` (scripts/bench.sh), $(date -u +%Y-%m-%d), $(nproc) cores,"
echo "$(uname -m), $(grep -m1 'model name' /proc/cpuinfo 2>/dev/null | sed 's/.*: //')."
echo "Fleet: cw-synth -n $devs -d $days -p $period -s 7, format a (gzip level 1):"
echo "$rows raw lines in $(echo $files | wc -w) day files; the sample stream has $srows rows."
echo "Times are medians of $reps alternating rounds (wall seconds); memory is peak RSS."
echo
echo "| what | seconds | ratio | peak RSS KiB | target |"
echo "| --- | --- | --- | --- | --- |"
row "floor A: zlib inflate" "$fa" "" "" ""
row "floor B: inflate + libcsv, raw" "$fb" "1.00" "" ""
row "cw-clean --step 60" "$c60" "$(ratio "$c60" "$fb") x B" "$c60m" "<= 1.5 x B"
row "cw-clean" "$c0" "$(ratio "$c0" "$fb") x B" "$c0m" ""
row "floor B over the sample stream" "$fbs" "1.00" "" ""
for k in rainflow thermal topoff dcir capacity wear; do
	set -- $(med $k)
	row "cw-$k" "$1" "$(ratio "$1" "$fbs") x B" "$2" "<= 2 x B, < 32 MiB"
done
row "pandas script (scripts/bench_pandas.py)" "$pds" "$(ratio "$pds" "$c60") x slower than cw-clean" "${pd#* }" ">= 15 x"
echo
echo "Scaling (cw-clean --step 60 over the raw files, cw-wear over the stream):"
echo
echo "| run | raw lines | clean s | clean KiB | wear s | wear KiB |"
echo "| --- | --- | --- | --- | --- | --- |"
echo "$sc" | awk '{ printf "| %s | %s | %s | %s | %s | %s |\n", $1, $2, $3, $4, $5, $6 }'
echo
echo "Peak memory with $nd devices (cw-synth -n $nd -d 1 -p 600):"
echo
echo "| tool | peak RSS KiB (target < 32768) |"
echo "| --- | --- |"
printf '%s' "$mem"
echo
echo "Instruction counts over $(basename "$first") (callgrind, repeatable):"
echo "$irs."
echo
echo "Two cores, GNU parallel over the day files: -j1 $p1s s, -j2 $p2s s,"
echo "speed-up $(ratio "$p1s" "$p2s") (target >= 1.7)."
echo
echo "Projection: at the measured cw-clean --step 60 rate, 86.4 million raw rows"
echo "(10,000 packs logging every 10 s for a day) take about $proj s of cw-clean"
echo "on one core, before cw-wear, which reads the 60 s stream (6x fewer rows)."
} >"$work/report.md"
cat "$work/report.md"
cp "$work/report.md" "$out"
