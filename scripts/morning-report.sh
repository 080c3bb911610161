#!/bin/sh
# The morning report: the packs that need attention and why, from the
# outputs of the analysis tools in one folder.
#
#   scripts/morning-report.sh [-n N] DIR [REGISTER]
#
# DIR holds cw-wear.csv (cw-wear), cw-thermal.csv (cw-thermal events),
# and, when present, cw-dcir-trend.csv (cw-dcir -t) and cw-topoff.csv
# (cw-topoff -s); columns are found by name.  REGISTER, optional, is a CSV
# whose first two columns are device and site, shown beside each pack.
# T1..T4 are the limits cw-thermal and cw-wear were run with (by default
# 0, 10, 45 and 60 C).  N packs are listed (default 5), most urgent first:
#
#   1. packs charged in a no-charging zone (below T1 or above T4 in
#      cw-thermal's events), most hours there first: a safety matter;
#   2. packs whose dominant stressor is cold-charge or heat, or whose
#      resistance grows by 5 % or more per 30 days (it would double within
#      two years) for sure: the lower end of the confidence interval of
#      the growth (cw-dcir's growth_lo_pct_per_30d) at 5 % or more, not
#      only the estimate; shortest time to end of life first;
#   3. the rest, shortest time to end of life (cw-wear's days_to_eol)
#      first.
#
# The ranking and the 5 % per 30 days are this script's choices (common
# practice, no source).  It advises; it is not a safety system.
set -eu
n=5
if [ "${1:-}" = "-n" ]; then
	[ $# -ge 2 ] || { echo "usage: $0 [-n N] DIR [REGISTER]" >&2; exit 2; }
	n=$2
	shift 2
fi
case $n in ''|*[!0-9]*|0)
	echo "morning-report: -n takes a whole number above 0" >&2; exit 2 ;;
esac
[ $# -ge 1 ] && [ $# -le 2 ] || {
	echo "usage: $0 [-n N] DIR [REGISTER]" >&2; exit 2; }
dir=$1
reg=${2:-/dev/null}
for f in cw-wear.csv cw-thermal.csv; do
	[ -r "$dir/$f" ] || {
		echo "morning-report: $dir/$f: cannot read it" >&2; exit 1; }
done
dcir=$dir/cw-dcir-trend.csv
[ -r "$dcir" ] || dcir=/dev/null
topoff=$dir/cw-topoff.csv
[ -r "$topoff" ] || topoff=/dev/null

LC_ALL=C awk -F, -v n="$n" -v reg="$reg" -v dcir="$dcir" -v topoff="$topoff" '
# Column numbers by header name, for the file being read.
function header(   i) {
	delete col
	for (i = 1; i <= NF; i++)
		col[$i] = i
}
function need(name, file) {
	if (!(name in col)) {
		printf "morning-report: %s: no column %s\n", file, name \
		    > "/dev/stderr"
		bad = 1
		exit 1
	}
	return col[name]
}
function v(name) { return (name in col) ? $(col[name]) : "" }
function hours(s) { return sprintf("%.1f h", s / 3600) }
BEGIN {
	while ((getline l < reg) > 0) {
		split(l, f, ",")
		site[f[1]] = f[2]
	}
	if ((getline l < dcir) > 0) {
		$0 = l; header()
		while ((getline l < dcir) > 0) {
			$0 = l
			if (v("growth_pct_per_30d") != "") {
				rg[$1] = v("growth_pct_per_30d") + 0
				reol[$1] = v("eol_date")
				# No lower end (an older cw-dcir): not sure.
				if (v("growth_lo_pct_per_30d") != "")
					rglo[$1] = v("growth_lo_pct_per_30d") + 0
			}
		}
	}
	if ((getline l < topoff) > 0) {
		$0 = l; header()
		while ((getline l < topoff) > 0) {
			$0 = l
			mcd[$1] = v("micro_cycles_per_day")
		}
	}
}
FNR == 1 {
	header()
	if (FILENAME ~ /cw-wear\.csv$/) {
		cdev = need("device", FILENAME)
		cfirst = need("first", FILENAME)
		clast = need("last", FILENAME); cdays = need("days", FILENAME)
		cfade = need("fade_pct", FILENAME)
		ceol = need("days_to_eol", FILENAME)
		cdom = need("dominant", FILENAME)
		ccold = need("cold_charge_ah", FILENAME)
		cchg = need("charge_ah", FILENAME)
		csoh = need("soh_pct", FILENAME)
		wear = 1
	} else {
		ckind = need("kind", FILENAME); czone = need("zone", FILENAME)
		cdur = need("duration_s", FILENAME)
		cah = need("charge_ah", FILENAME)
		wear = 0
	}
	next
}
wear {
	d = $cdev
	dev[++ndev] = d
	if (first == "" || $cfirst < first) first = $cfirst
	if ($clast > last) last = $clast
	if ($cdays > span) span = $cdays
	fade[d] = $cfade; eol[d] = $ceol; dom[d] = $cdom; days[d] = $cdays
	soh[d] = $csoh
	coldsh[d] = $cchg > 0 ? 100 * $ccold / $cchg : 0
	next
}
$ckind == "charge" {
	z = $czone
	if (z == "below-min" || z == "above-max") {
		nx[$1 SUBSEP z]++; sx[$1 SUBSEP z] += $cdur
		ax[$1 SUBSEP z] += $cah; sx[$1] += $cdur
	} else {
		nsoft[$1 SUBSEP z]++
		soft[z] = soft[z] (index(soft[z] " ", " " $1 " ") ? "" : " " $1)
	}
}
END {
	if (bad)
		exit 1
	for (i = 1; i <= ndev; i++) {
		d = dev[i]
		e = eol[d] == "" ? 1e9 : eol[d] + 0
		if (sx[d] > 0)
			key = sprintf("1 %015.3f", 1e9 - sx[d])
		else if (dom[d] == "cold-charge" || dom[d] == "heat" ||
		    ((d in rglo) && rglo[d] >= 5))
			key = sprintf("2 %015.3f", e)
		else
			key = sprintf("3 %015.3f", e)
		rank[i] = key " " d
	}
	# Insertion sort: a fleet is small next to the rows it logged.
	for (i = 2; i <= ndev; i++) {
		k = rank[i]
		for (j = i - 1; j >= 1 && rank[j] > k; j--)
			rank[j + 1] = rank[j]
		rank[j + 1] = k
	}
	printf "Morning report: %d packs, %s to %s (%.1f days)\n", ndev,
	    substr(first, 1, 10), substr(last, 1, 10), span
	m = n < ndev ? n : ndev
	printf "The %d that need attention first: charged where no charging " \
	    "should be,\nthen cold-charge, heat or fast resistance growth, " \
	    "then the shortest life.\n", m
	for (i = 1; i <= m; i++) {
		split(rank[i], f, " ")
		d = f[3]
		printf "\n%2d. %s%s: %s", i, d,
		    (d in site) ? " at " site[d] : "",
		    dom[d] == "" ? "no model estimate" : dom[d]
		if (dom[d] == "cold-charge")
			printf ", %.0f %% of its charge below T1", coldsh[d]
		printf "\n"
		for (zi = 1; zi <= 2; zi++) {
			z = zi == 1 ? "below-min" : "above-max"
			if (nx[d SUBSEP z] > 0)
				printf "    charged %s in %d events: " \
				    "%s, %.1f Ah\n", z == "below-min" ? \
				    "below T1 (below-min)" : \
				    "above T4 (above-max)", nx[d SUBSEP z],
				    hours(sx[d SUBSEP z]), ax[d SUBSEP z]
		}
		if (fade[d] != "")
			printf "    modelled fade %.2f points in %.1f days%s",
			    fade[d], days[d], soh[d] != "" ? \
			    sprintf(", SoH %.1f %%", soh[d]) : ""
		if (eol[d] != "")
			printf "; 80 %% health in %.1f years at this pace",
			    eol[d] / 365.25
		else if (dom[d] == "cold-charge" && fade[d] != "")
			printf "; no life told (the model has no plating term)"
		if (fade[d] != "")
			printf "\n"
		if (d in rg)
			printf "    resistance %+.1f %% per 30 days%s%s\n", rg[d],
			    (d in rglo) ? sprintf(" (at least %+.1f %%)", \
			    rglo[d]) : "", reol[d] != "" ? "; doubled by " \
			    reol[d] " at this pace" : ""
		if ((d in mcd) && mcd[d] != "" && mcd[d] >= 5)
			printf "    %.0f top-off micro-cycles a day (rides " \
			    "not counted)\n", mcd[d]
	}
	nc = split(soft["cool"], f, " ")
	nw = split(soft["warm"], f, " ")
	if (nc + nw > 0)
		printf "\n"
	if (nc > 0)
		printf "Also: %d packs charged cool (T1 to T2) " \
		    "at times; see cw-thermal.csv.\n", nc
	if (nw > 0)
		printf "Also: %d packs charged warm (T3 to T4) " \
		    "at times; see cw-thermal.csv.\n", nw
	printf "\nThe tools advise; they are not a safety system.  A pack " \
	    "charged below\nfreezing may have plated lithium: take it out " \
	    "of service as its maker\nand the local rules direct, and check " \
	    "the charger that did it.\n"
}' "$dir/cw-wear.csv" "$dir/cw-thermal.csv"
