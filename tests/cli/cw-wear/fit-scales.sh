# --fit-scales against scales it must find: four packs of 20 days (rows
# every 10 min) whose "measured" fade is the model's own at --cycle-life
# 800 and --calendar-life 2000, written here as a cw-capacity --trend
# file (slope = -fade_pct * 14 / 100 / days, a sure interval, the
# estimates over the whole span).  The fit starts from the published
# constants (cycle_life 2786.7, calendar_life 4582.8 days, the "before"
# column) and must end at 800 and 2000 (printed to 4 digits) with an rms
# error near 0 (below 1e-6 points: "rms ok").  Packs with different
# mixes of cycling and rest, so the two scales are told apart:
#   CYC  cycles 0-100 % every 4 h at 25 C   REST rest at 50 %, 25 C
#   HOT  rest at 100 %, 35 C                MIX  cycles 20-80 % at 30 C
# Then the fit of one pack (needs 2: exit 1) and of two packs with the
# same history (cannot tell cycling from rest: one factor, a warning).
# source: hand
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN {
	print "device,time,current_a,temp_c,soc_pct"
	for (k = 0; k <= 20 * 144; k++) {
		t = 1767225600 + 600 * k
		p = k % 24; up = p < 12
		s = up ? p * 100 / 12 : (24 - p) * 100 / 12
		printf "CYC,%d,%s,25,%g\n", t, up ? 5 : -5, s
		printf "REST,%d,0,25,50\n", t
		printf "HOT,%d,0,35,100\n", t
		s = up ? 20 + p * 5 : 20 + (24 - p) * 5
		printf "MIX,%d,%s,30,%g\n", t, up ? 3 : -3, s
		printf "REST2,%d,0,25,50\n", t
	}
}' >in.csv
cw-wear --capacity 14 --cycle-life 800 --calendar-life 2000 -o model.csv \
    in.csv
# The trend of the packs named in $1 from model.csv, to $2.
trend() {
	awk -F, -v want="$1" 'BEGIN { n = split(want, w, " ")
		for (k = 1; k <= n; k++) ok[w[k]] = 1
		print "device,estimates,first,last,capacity_start_ah," \
		    "slope_ah_per_day,slope_lo_ah_per_day,slope_hi_ah_per_day" }
	NR > 1 && ok[$1] {
		s = -$18 * 14 / 100 / $4
		printf "%s,20,%s,%s,14,%.17g,%.17g,%.17g\n", $1, $2, $3, s,
		    1.1 * s, 0.9 * s }' model.csv >"$2"
}
trend "CYC REST HOT MIX" t4.csv
cw-wear --capacity 14 --measured t4.csv --fit-scales -o fit.csv in.csv
echo "rc $?"
awk -F, '$1 ~ /life|packs/ { printf "%s,%.4g,%.4g\n", $1, $2, $3 }
    $1 == "rms_error_pct" { print ($3 < 1e-6 ? "rms ok" : "rms " $3) }' \
    fit.csv
trend "CYC" t1.csv
cw-wear --capacity 14 --measured t1.csv --fit-scales in.csv
echo "rc $?"
trend "REST REST2" t2.csv
cw-wear --capacity 14 --measured t2.csv --fit-scales -o fit2.csv in.csv
echo "rc $?"
awk -F, '$1 ~ /scale$/ { printf "%s,%.4g,%.4g\n", $1, $2, $3 }
    $1 ~ /correlation/' \
    fit2.csv
