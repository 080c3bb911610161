#!/bin/sh
# make demo: the whole job of cellwear in one command, on an invented
# bike-share fleet.
#
#   1. cw-synth simulates the fleet (24 packs, 28 winter days, one row per
#      pack every 10 s) and writes its raw gauge logs (format a: epoch ms,
#      mV, mA charge-negative, 0.1 K, and the dock each pack sits at: packs
#      hop between docks) and the truth it injected, into demo/in/;
#   2. cw-clean turns the logs into one sample stream, demo/out/cw-clean.csv.gz,
#      and keeps every line it rejected in demo/out/cw-clean-rejects.csv;
#   3. every analysis tool reads that stream and writes demo/out/<tool>.csv;
#   4. gnuplot draws the plots of scripts/plot-*.gp into demo/out/*.png
#      (dwell.png: where the idle-dock group spends its time, from
#      cw-wear --dwell; measured.png: modelled against measured fade per
#      pack, from cw-wear --measured and cw-capacity --trend, with the
#      model's scales fitted to it in cw-wear-fit.csv);
#   5. cw-report prints the packs that need attention, most urgent first
#      (demo/out/report.txt; exit 3 of cw-report, "something to act on",
#      is not a failure of the demo).
#      Then cw-thermal --by dock --summary says which dock charges in
#      the cold (demo/out/cold-docks.txt).
#
# demo/in and demo/out are emptied first and ignored by git.  Settings can
# be changed from the environment: DEMO_DEVICES, DEMO_DAYS, DEMO_START
# (YYYY-MM-DD), DEMO_SEED; DEMO_DIR (default demo) holds in/ and out/;
# DEMO_NOBUILD=1 skips `make all`.
set -eu
top=$(cd "$(dirname "$0")/.." && pwd)
cd "$top"
PATH="$top/bin:$PATH"
LC_ALL=C
export PATH LC_ALL

devs=${DEMO_DEVICES:-24}
days=${DEMO_DAYS:-28}
start=${DEMO_START:-2026-01-12}
seed=${DEMO_SEED:-1}
dir=${DEMO_DIR:-demo}
[ -n "$dir" ] || { echo "demo: DEMO_DIR is empty" >&2; exit 2; }
# A relative folder named like a=b would be an assignment to awk.
case $dir in /*) ;; *) dir=./$dir ;; esac
in=$dir/in
out=$dir/out

say() { printf 'demo: %s\n' "$*" >&2; }
die() { printf 'demo: %s\n' "$*" >&2; exit 1; }

command -v gnuplot >/dev/null 2>&1 ||
	die "gnuplot not found; scripts/deps installs it (Debian gnuplot-nox)"
[ -n "${DEMO_NOBUILD:-}" ] || make -s all
t0=$(date +%s)
rm -rf "$in" "$out"
mkdir -p "$in" "$out"
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT

# Jobs run side by side; waitall fails when any of them failed.
pids=
job() { "$@" & pids="$pids $!"; }
waitall() {
	rc=0
	for p in $pids; do wait "$p" || rc=1; done
	pids=
	return $rc
}

compress() { gzip -1 <"$1" >"$2"; }

# charging_temp STREAM REGISTER OUT: device,time,temp_c,group of the rows
# charging above 0.05 A (cw-thermal's default), the first of each minute.
charging_temp() {
	gzip -dc "$1" | awk -F, -v reg="$2" '
	BEGIN {
		while ((getline l < reg) > 0) {
			split(l, f, ","); g[f[1]] = f[3]
		}
		print "device,time,temp_c,group"
	}
	NR > 1 && $4 > 0.05 && $5 != "" && substr($2, 18, 2) < 10 {
		print $1 "," $2 "," $5 "," g[$1]
	}' >"$3"
}

# rainflow_groups CYCLES REGISTER WEAR: the cycles of cw-rainflow summed
# per group of the register in bins of 10 % depth (a depth on a bin edge
# in the lower bin, as cw-rainflow --histogram), per pack and day: over
# the days (cw-wear's days column) of all the group's packs.
rainflow_groups() {
	echo group,range_lo,range_hi,cycles_per_pack_day
	awk -F, -v reg="$2" -v wear="$3" '
	BEGIN {
		while ((getline l < reg) > 0) {
			split(l, f, ","); g[f[1]] = f[3]
		}
		while ((getline l < wear) > 0) {
			split(l, f, ",")
			if (f[1] != "device")
				days[g[f[1]]] += f[4]
		}
	}
	NR > 1 {
		b = int($2 / 10)
		if (b * 10 < $2)
			b++
		c[g[$1] "," b] += $4
	}
	END {
		for (k in c) {
			split(k, f, ",")
			printf "%s,%d,%d,%.6g\n", f[1], (f[2] - 1) * 10,
			    f[2] * 10, c[k] / days[f[1]]
		}
	}' "$1" | sort -t, -k1,1 -k2,2n
}

# dwell_group DWELL REGISTER WEAR GROUP: cw-wear --dwell summed over the
# packs of GROUP in the register, per pack and day (cw-wear's days column),
# every cell of the default bands (temperature edges 0, 10, 25, 35, 45 C),
# for scripts/plot-dwell.gp.
dwell_group() {
	awk -F, -v reg="$2" -v wear="$3" -v grp="$4" '
	BEGIN {
		while ((getline l < reg) > 0) {
			split(l, f, ","); g[f[1]] = f[3]
		}
		while ((getline l < wear) > 0) {
			split(l, f, ",")
			if (f[1] != "device" && g[f[1]] == grp)
				days += f[4]
		}
		n = split("0 10 25 35 45", e, " ")
		for (k = 1; k <= n; k++)
			ti[e[k]] = k
		split("0 20 40 60 80 95 100", sb, " ")
	}
	NR > 1 && g[$1] == grp {
		c = ($2 == 95 ? 5 : $2 / 20) "," ($4 == "" ? 0 : ti[$4])
		h[c] += $6; i[c] += $7
	}
	END {
		print "soc_i,temp_i,soc_band,temp_band,hours_per_pack_day," \
		    "idle_pct"
		for (s = 0; s < 6; s++)
			for (t = 0; t <= n; t++) {
				c = s "," t
				tb = t == 0 ? "<" e[1] : t == n ? ">" e[n] : \
				    e[t] "-" e[t + 1]
				printf "%s,%s-%s,%s,%.6g,%.4g\n", c, sb[s + 1],
				    sb[s + 2], tb, (days > 0 ? h[c] / days : 0),
				    (h[c] > 0 ? 100 * i[c] / h[c] : 0)
			}
	}' "$1"
}

say "cw-synth: $devs packs, $days days from $start, seed $seed -> $in/"
cw-synth -n "$devs" -d "$days" -S "$start" -s "$seed" --docks -o "$in"

# The operator's asset register, which a real fleet keeps anyway: each
# pack's home site (packs hop, so the dock column of the logs is where
# one charged) and the group of riders it serves.  Only the plots and
# the report read it; the tools never see the truth.
awk -F, 'NR == 1 { print "device,site,group"; next }
    { print $1 "," $4 "," $2 }' "$in/truth-devices.csv" >"$in/fleet.csv"

# Cleaning.  The packs are 10 cells in series; the gauges count charging
# as negative.  cw-clean's default --sentinel list rejects the gauges'
# no-value codes (-32768, 65535) by their raw value; the current bound is
# a plausibility bound: no real current of these packs comes near 30 A
# (the depot charger gives 14 A).  --keep dock carries the dock column of
# the logs into the stream, for cw-thermal --by dock.
say "cw-clean: raw logs -> $out/cw-clean.csv.gz (rejects kept)"
mkfifo "$tmp/stream"
job compress "$tmp/stream" "$out/cw-clean.csv.gz"
job cw-clean -v --charge-negative --cells 10 --bounds current=-30:30 \
    --keep dock \
    --rejects "$out/cw-clean-rejects.csv" -o "$tmp/stream" \
    "$in"/*.a.csv.gz 2>"$out/cw-clean.log"
waitall || { cat "$out/cw-clean.log" >&2; die "cw-clean failed"; }
tail -n 2 "$out/cw-clean.log" | sed "s/^/demo: /" >&2

# Analysis, every tool on the same stream at its native 10 s rate.  The
# DCIR gates are widened for a winter fleet (most charging starts near
# 10 C, most top-ups above 80 %); the activation energy stays at the
# default 30 kJ/mol, which is what cw-synth's cells have.  Real cells
# need theirs fitted first (see cw-dcir(1)).  The trend takes each pack's
# own SoC window (--soc auto), so that dock packs, which live near full,
# get one too.
# cw-thermal judges charging in the cool and warm zones by the JEITA
# scheme's reduced current and voltage, which need the packs' rated 14 Ah
# and 10 cells (the register holds neither).
S=$out/cw-clean.csv.gz
DCIR="--temp -10,45 --soc 10,90"
say "analysis: cw-rainflow cw-thermal cw-topoff cw-dcir cw-wear cw-capacity" \
    "cw-volt -> $out/"
job cw-rainflow -o "$out/cw-rainflow.csv" "$S"
job cw-thermal --capacity 14 --cells 10 -o "$out/cw-thermal.csv" "$S"
job cw-thermal -s --capacity 14 --cells 10 \
    -o "$out/cw-thermal-summary.csv" "$S"
job cw-thermal --by dock -s -o "$out/cw-thermal-docks.csv" "$S"
job cw-topoff -s -o "$out/cw-topoff.csv" "$S"
job cw-capacity -t --rated 14 -o "$out/cw-capacity-trend.csv" "$S"
job cw-volt -s --cells 10 -o "$out/cw-volt-summary.csv" "$S"
job cw-dcir $DCIR -o "$out/cw-dcir.csv" "$S"
job cw-dcir -t --temp -10,45 --soc auto -o "$out/cw-dcir-trend.csv" "$S"
job cw-wear --cycle-life 500 --capacity 14 -o "$out/cw-wear.csv" "$S"
job cw-wear --dwell -o "$out/cw-wear-dwell.csv" "$S"
# Temperature of the charging rows, one a minute per pack, for the plot.
job charging_temp "$S" "$in/fleet.csv" "$out/charging-temp.csv"
waitall || die "an analysis tool failed"

# The model against the measured capacity: cw-wear's fade beside the
# Theil-Sen trend of cw-capacity, and the model's scales fitted to it.
say "cw-wear --measured: $out/cw-wear-measured.csv, cw-wear-fit.csv"
# The fit needs two packs with a sure measured fade, which a short run
# may not have.
M="--cycle-life 500 --capacity 14"
job cw-wear $M --measured "$out/cw-capacity-trend.csv" \
    -o "$out/cw-wear-measured.csv" "$S"
cw-wear $M --measured "$out/cw-capacity-trend.csv" --fit-scales \
    -o "$out/cw-wear-fit.csv" "$S" 2>"$out/cw-wear-fit.log" ||
	say "no scales fitted: $(tail -n 1 "$out/cw-wear-fit.log")"
waitall || die "cw-wear --measured failed"

# Where the packs held in docks spend their time.
dwell_group "$out/cw-wear-dwell.csv" "$in/fleet.csv" "$out/cw-wear.csv" \
    idle-dock >"$out/dwell-idle-dock.csv"
# Rainflow depth histogram per group of packs.
rainflow_groups "$out/cw-rainflow.csv" "$in/fleet.csv" "$out/cw-wear.csv" \
    >"$out/rainflow-groups.csv"

# The packs whose resistance grows fastest, for the DCIR plot; in a run
# too short for any trend, the packs with the most steps.  The names go to
# gnuplot as a data file, one a line, never as code.
tab=$(printf '\t')
top4() { sort -t "$tab" -k1,1rn | head -n 4 | cut -f 2; }
awk -F, 'NR > 1 && $8 != "" { print $8 "\t" $1 }' "$out/cw-dcir-trend.csv" |
    top4 >"$out/dcir-packs.txt"
[ -s "$out/dcir-packs.txt" ] ||
	awk -F, 'NR > 1 { print $2 "\t" $1 }' "$out/cw-dcir-trend.csv" |
	    top4 >"$out/dcir-packs.txt"

# gq S: S as the body of a gnuplot single-quoted string ('' is a quote).
gq() { printf '%s' "$1" | sed "s/'/''/g"; }
o=$(gq "$out")
say "gnuplot: $out/*.png"
job gnuplot -e "in='$o/cw-wear.csv'; out='$o/fade.png'" \
    scripts/plot-fade.gp
job gnuplot -e "steps='$o/cw-dcir.csv'; trend='$o/cw-dcir-trend.csv'; \
    packsfile='$o/dcir-packs.txt'; out='$o/dcir.png'" scripts/plot-dcir.gp
job gnuplot -e "in='$o/cw-wear-measured.csv'; out='$o/measured.png'" \
    scripts/plot-measured.gp
job gnuplot -e "in='$o/rainflow-groups.csv'; out='$o/rainflow.png'" \
    scripts/plot-rainflow.gp
job gnuplot -e "in='$o/charging-temp.csv'; out='$o/charge-temp.png'" \
    scripts/plot-charge-temp.gp
job gnuplot -e "in='$o/dwell-idle-dock.csv'; out='$o/dwell.png'; \
    title='Idle-dock packs: hours per pack and day by SoC and temperature'" \
    scripts/plot-dwell.gp
waitall || die "gnuplot failed"

# The morning report from the per-pack outputs, dates at the fleet's
# local offset (cw-synth's default, +01:00).
rc=0
cw-report --fleet "$in/fleet.csv" --tz +01:00 -o "$out/report.txt" \
    "$out/cw-wear.csv" "$out/cw-thermal-summary.csv" "$out/cw-topoff.csv" \
    "$out/cw-dcir-trend.csv" "$out/cw-capacity-trend.csv" \
    "$out/cw-volt-summary.csv" || rc=$?
[ $rc -eq 0 ] || [ $rc -eq 3 ] || die "cw-report failed"
cat "$out/report.txt"
# Packs hop between docks, so the report's per-pack site cannot name the
# charger: the summary per dock can (events_below_min and ah_below_min
# found by name).
awk -F, 'NR == 1 { for (k = 1; k <= NF; k++) c[$k] = k; next }
    $c["events_below_min"] > 0 {
	printf "%s%s: %d charge events below T1, %.2f Ah, %d packs there\n",
	    n++ ? "" : "Docks that charged in the cold (cw-thermal --by dock):\n",
	    ($1 == "" ? "(away)" : $1), $c["events_below_min"],
	    $c["ah_below_min"], $c["devices"] }
    END { if (!n) print "No dock charged below T1." }' \
    "$out/cw-thermal-docks.csv" | tee "$out/cold-docks.txt"
say "done in $(( $(date +%s) - t0 )) s; outputs in $out/"
