# --measured: measured_fade_pct and model_error_pct from a cw-capacity
# --trend file (cw-wear(1), MEASURED FADE).  Every pack spans 10 days
# (rows every 10 min at rest, 50 % SoC, 25 C).  The trend file is written
# here by hand:
#   A      slope -0.02 Ah/day, interval below zero, estimates cover
#          day 1..9 (80 % of the span): 0.02 * 10 / 14 * 100 =
#          1.428571 points of the rated 14 Ah (--capacity 14)
#   B      interval -0.01..0.002 holds zero: empty (no sure fade)
#   C      not in the file: empty
#   D      estimates cover day 0..4 only (40 % < 50 %): empty
#   "E, q" a quoted name with a comma and a quote, matched by name;
#          slope -0.07: 5 points
#   F      too few estimates (empty slope): empty
# Without --capacity, A's base is the file's rated_ah (20 Ah): 1.0 point,
# and "E, q" has no rated_ah, so its capacity_start_ah (10 Ah): 7 points.
# model_error_pct must be fade_pct - measured_fade_pct on every row (the
# check below recomputes it from the row's own fade_pct, prints "error
# ok").  fade_pct itself: snapshot.  Then the error cases: a per-estimate
# cw-capacity output is not a trend (exit 1, FILE:LINE), a bad slope
# (exit 1, FILE:LINE), --fit-scales without --measured (exit 2).
# source: hand
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN {
	print "device,time,current_a,temp_c,soc_pct"
	for (k = 0; k <= 10 * 144; k++) {
		t = 1767225600 + 600 * k
		printf "A,%d,0,25,50\nB,%d,0,25,50\nC,%d,0,25,50\n", t, t, t
		printf "D,%d,0,25,50\n\"E, \"\"q\"\"\",%d,0,25,50\n", t, t
		printf "F,%d,0,25,50\n", t
	}
}' >in.csv
H=device,estimates,first,last,capacity_start_ah,capacity_end_ah,fade_pct
H=$H,fade_pct_per_30d,soh_pct,eol_date,slope_ah_per_day
H=$H,slope_lo_ah_per_day,slope_hi_ah_per_day,fit_estimates,rated_ah
cat >trend.csv <<EOT
$H
A,9,2026-01-02T00:00:00Z,2026-01-10T00:00:00Z,19,18.84,,,,,-0.02,-0.025,-0.015,9,20
B,9,2026-01-02T00:00:00Z,2026-01-10T00:00:00Z,19,18.9,,,,,-0.004,-0.01,0.002,9,20
D,9,2026-01-01T00:00:00Z,2026-01-05T00:00:00Z,19,18.9,,,,,-0.02,-0.025,-0.015,9,20
"E, ""q""",9,2026-01-01T12:00:00Z,2026-01-10T12:00:00Z,10,9.4,,,,,-0.07,-0.08,-0.06,9,
F,3,2026-01-02T00:00:00Z,2026-01-05T00:00:00Z,,,,,,,,,,,20
EOT
cols() {
	/usr/bin/python3 -c '
import csv, sys
for r in csv.DictReader(open(sys.argv[1])):
    print(",".join([r["device"], r["fade_pct"], r["measured_fade_pct"],
        r["model_error_pct"]]))' "$1"
}
check() {
	/usr/bin/python3 -c '
import csv, sys
bad = 0
for r in csv.DictReader(open(sys.argv[1])):
    m, e = r["measured_fade_pct"], r["model_error_pct"]
    if (m == "") != (e == ""):
        bad += 1
    elif m and abs(float(r["fade_pct"]) - float(m) - float(e)) > 1e-9:
        bad += 1
print("error ok" if bad == 0 else "error wrong on %d rows" % bad)' "$1"
}
cw-wear --capacity 14 --measured trend.csv -o out.csv in.csv
echo "rc $?"
cols out.csv
check out.csv
cw-wear -v --measured trend.csv -o out2.csv in.csv 2>&1 | grep measured
cols out2.csv
check out2.csv
printf 'device,start,end,direction,soc_from_pct,soc_to_pct,charge_ah,capacity_ah,temp_c\n' >est.csv
cw-wear --measured est.csv in.csv >/dev/null
echo "rc $?"
sed 's/^A,9,\(.*\),-0.02,/A,9,\1,-0.0x2,/' trend.csv >bad.csv
cw-wear --measured bad.csv in.csv >/dev/null
echo "rc $?"
cw-wear --fit-scales in.csv >/dev/null
echo "rc $?"
cw-wear --measured trend.csv --dwell in.csv >/dev/null
echo "rc $?"
