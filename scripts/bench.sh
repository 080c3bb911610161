#!/bin/sh
# make bench: how fast cellwear is next to its physical floors and to a
# pandas script doing the same cleaning.  Results go to stdout and to
# BENCHMARKS.md (or $BENCH_OUT), above its marker line; the notes below
# the marker are kept.  Timing is never asserted: this reports.
#
#   scripts/bench.sh            the full run (5.2 million rows and more)
#   scripts/bench.sh --tiny     a few thousand rows, to keep the script
#                               working (make check runs this)
#   scripts/bench.sh --day      only the 10,000-pack day (cached), to stdout
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

# rounds FILE NAME CMD [NAME CMD ...]: REPS rounds, each running every
# CMD once in turn, so that drift in the machine's speed hits them all
# alike; FILE gets "NAME SECONDS KIB LOAD" per run (LOAD: the 1-minute
# load average after it).
rounds() {
	rfile=$1
	shift
	: >"$rfile"
	r=0
	while [ $r -lt "$reps" ]; do
		n=1
		while [ $n -lt $# ]; do
			eval "name=\${$n}; cmd=\${$((n + 1))}"
			res=$(reps=1 t "$cmd")
			load=$(awk '{ print $1 }' /proc/loadavg 2>/dev/null)
			echo "$name $res ${load:-?}" >>"$rfile"
			n=$((n + 2))
		done
		r=$((r + 1))
	done
}

gen() {	# gen DIR DEVICES DAYS PERIOD
	rm -rf "$1"
	cw-synth -n "$2" -d "$3" -p "$4" -s 7 -o "$1" >/dev/null
}

daybench() {
	# The 10,000-pack day (issue 21): cw-synth -n 10000 -d 1 at 10 s, one
	# gzipped file of about 1 GB, generated once (about 150 s) and kept in
	# $BENCH_CACHE (default build/bench-cache) for later runs.  Floors A and B,
	# cw-clean on two threads and on one (CW_THREADS=0), and the pipe into
	# cw-wear, alternated round by round; the load beside each median; the
	# sha256 of the cw-clean stream, the same on one thread and two.
	if [ $tiny -eq 1 ]; then
		dn=50 dcache="$work/day"
	else
		dn=10000 dcache=${BENCH_CACHE:-build/bench-cache}/day$dn
	fi
	if [ ! -f "$dcache/done" ]; then
		gen "$dcache" $dn 1 10
		: >"$dcache/done"
	fi
	df=$(ls "$dcache"/*.a.csv.gz)
	dsize=$(wc -c <"$df")
	DAY60="$CLEAN --step 60 $df"
	rm -f "$work/lines"
	mkfifo "$work/lines"
	wc -l <"$work/lines" >"$work/nlines" &
	sum1=$($DAY60 2>/dev/null | tee "$work/lines" | sha256sum | cut -c1-64)
	wait
	drows=$(tr -d ' ' <"$work/nlines")
	sum0=$(CW_THREADS=0 $DAY60 2>/dev/null | sha256sum | cut -c1-64)
	set -- \
	    "dfloorA" "$FA $df" \
	    "dfloorB" "$FB $df" \
	    "dclean" "$DAY60" \
	    "dclean1" "CW_THREADS=0 $DAY60" \
	    "dpipe" "$DAY60 | cw-wear"
	dres="$work/dresults"
	rounds "$dres" "$@"
	dmed() {	# dmed NAME: "SECONDS KIB LOADS" (the loads of every round)
		awk -v k="$1" '$1 == k { print $2, $3, $4 }' "$dres" | sort -n |
		    awk '{ t[NR] = $1; if ($2 > m) m = $2; l = l (NR > 1 ? "/" : "") $3 }
		    END { printf "%s %s %s\n", t[int((NR + 1) / 2)], m, l }'
	}
	set -- $(dmed dfloorB); dfb=$1
	: >"$work/dayrows"
	for k in "dfloorA floor A: zlib inflate" \
	    "dfloorB floor B: inflate + libcsv" \
	    "dclean cw-clean --step 60 (two threads)" \
	    "dclean1 cw-clean --step 60, CW_THREADS=0" \
	    "dpipe cw-clean --step 60 piped into cw-wear"; do
		set -- $(dmed ${k%% *})
		row "${k#* }" "$1" "$(ratio "$1" "$dfb") x B" "$2" "$3" \
		    >>"$work/dayrows"
	done
}

dayreport() {
	echo
	echo "The $dn-pack day (cw-synth -n $dn -d 1 -s 7, 10 s; $dsize bytes gzipped,"
	echo "cached in $dcache): medians of $reps alternating rounds, with the"
	echo "load average (1 min) after each round."
	echo
	echo "| what | seconds | ratio | peak RSS KiB | load per round |"
	echo "| --- | --- | --- | --- | --- |"
	cat "$work/dayrows"
	echo
	echo "sha256 of the cw-clean --step 60 stream ($drows lines): two threads $sum1,"
	echo "one thread $sum0$([ "$sum1" = "$sum0" ] && echo " (the same)" || echo " (DIFFERENT)")."
}

# --day: only the 10,000-pack day, its table on stdout (BENCHMARKS.md is
# left alone).
if [ "${1:-}" = "--day" ]; then
	daybench
	dayreport
	exit 0
fi

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
rounds "$results" "$@"
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

daybench

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
dayreport
} >"$work/report.md"
cat "$work/report.md"
# The notes of earlier runs, from the marker line on, stay in $out: a run
# replaces only what is above it.
marker='<!-- scripts/bench.sh keeps everything below this line -->'
{
	cat "$work/report.md"
	if [ -f "$out" ] && grep -qxF "$marker" "$out"; then
		echo
		awk -v m="$marker" 'k || $0 == m { k = 1; print }' "$out"
	fi
} >"$work/out.md"
cp "$work/out.md" "$out"
