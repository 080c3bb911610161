# Pack temperature while charging, over time, against the safe charging
# window: the zones T1..T4 of cw-thermal (default 0, 10, 45, 60 C) drawn
# as bands, one colour of points per group of packs.  Input: a CSV with
# the columns device,time,temp_c,group, one row per charging sample (or
# fewer: scripts/demo.sh keeps one a minute), times ISO 8601 UTC as the
# sample stream has them.  From a sample stream and an asset register
# (device,site,group):
#
#   awk -F, 'NR == FNR { g[$1] = $3; next }
#       FNR == 1 { print "device,time,temp_c,group"; next }
#       $4 > 0.05 && $5 != "" { print $1 "," $2 "," $5 "," g[$1] }' \
#       fleet.csv stream.csv >charging.csv
#   gnuplot -e "in='charging.csv'; out='charge-temp.png'" \
#       scripts/plot-charge-temp.gp
#
# Optional: limits='T1,T2,T3,T4' (degrees C, as cw-thermal --limits),
# groups='...' (in order, up to 6), title='...', width=, height=.
if (!exists("in")) in = 'charging-temp.csv'
if (!exists("out")) out = 'charge-temp.png'
if (!exists("limits")) limits = '0,10,45,60'
if (!exists("groups")) groups = 'deep-depot topup-dock idle-dock topup-nocutoff'
if (!exists("width")) width = 1200
if (!exists("height")) height = 220 * words(groups) + 140
if (!exists("title")) title = 'Pack temperature while charging, ' . \
    'against the charging window (cw-thermal zones)'

set datafile separator ","
set datafile columnheaders
fmt = "%Y-%m-%dT%H:%M:%SZ"
pal = "#e69f00 #56b4e9 #009e73 #0072b2 #d55e00 #cc79a7"
n = words(groups)
# The four limits, from the comma-separated list.
array lim[4]
rest = limits . ","
do for [k = 1:4] {
	c = strstrt(rest, ",")
	if (c < 2) {
		print "plot-charge-temp.gp: limits='T1,T2,T3,T4', four numbers"
		exit status 2
	}
	lim[k] = real(rest[1:c - 1])
	rest = rest[c + 1:]
}
t1 = lim[1]; t2 = lim[2]; t3 = lim[3]; t4 = lim[4]

stats in using (column("temp_c")) nooutput
ylo = (STATS_min < t1 ? STATS_min : t1) - 8
yhi = (STATS_max > t4 ? STATS_max : t4) + 10
stats in using (timecolumn(2, fmt)) nooutput
xlo = STATS_min; xhi = STATS_max

set terminal pngcairo size width, height font "sans,11" noenhanced
set output out
set xdata time
set timefmt fmt
set format x "%d %b"
set xrange [xlo:xhi]
xfmt = xhi - xlo < 4 * 86400 ? "%d %b\n%H:%M" : "%d %b"
# A round time between ticks (1 h to 4 weeks), at least an eighth of the
# span.
steps_s = "3600 7200 10800 21600 43200 86400 172800 604800 1209600 2419200"
inc = 0
do for [k = 1:words(steps_s)] {
	if (inc == 0 && word(steps_s, k) + 0 >= (xhi - xlo) / 8) {
		inc = word(steps_s, k) + 0
	}
}
if (inc == 0) { inc = (xhi - xlo) / 8 }
set xtics inc
set yrange [ylo:yhi]
set xtics nomirror
set ytics 20 nomirror
set mytics 2
set grid xtics ytics lc rgb "#e0e0e0"
unset key

# The zones, as bands behind the points, named at the right.
set object 1 rect from graph 0, first ylo to graph 1, first t1 \
    fc rgb "#d62728" fs solid 0.25 noborder behind
set object 2 rect from graph 0, first t1 to graph 1, first t2 \
    fc rgb "#ff9f1c" fs solid 0.25 noborder behind
set object 3 rect from graph 0, first t2 to graph 1, first t3 \
    fc rgb "#2ca02c" fs solid 0.12 noborder behind
set object 4 rect from graph 0, first t3 to graph 1, first t4 \
    fc rgb "#ff9f1c" fs solid 0.25 noborder behind
set object 5 rect from graph 0, first t4 to graph 1, first yhi \
    fc rgb "#d62728" fs solid 0.25 noborder behind
set label 1 sprintf("below-min, < %g °C", t1) \
    at graph 1.01, first (ylo + t1) / 2 left font "sans,9"
set label 2 sprintf("cool, %g to %g °C", t1, t2) \
    at graph 1.01, first (t1 + t2) / 2 left font "sans,9"
set label 3 sprintf("normal, %g to %g °C", t2, t3) \
    at graph 1.01, first (t2 + t3) / 2 left font "sans,9"
set label 4 sprintf("warm, %g to %g °C", t3, t4) \
    at graph 1.01, first (t3 + t4) / 2 left font "sans,9"
set label 5 sprintf("above-max, > %g °C", t4) \
    at graph 1.01, first (t4 + yhi) / 2 left font "sans,9"

# One panel per group, the same axes in each.
set multiplot layout n, 1 title title font "sans,13" \
    margins 0.08, 0.84, 0.09, 0.93 spacing 0, 0.035
do for [i = 1:n] {
	set label 10 word(groups, i) at graph 0.01, graph 0.9 left front \
	    font "sans,11" tc rgb word(pal, i) boxed
	if (i == 1) {
		set label 11 "pack temperature while charging (°C)" \
		    at screen 0.02, screen 0.51 center rotate by 90
	} else {
		unset label 11
	}
	if (i == n) {
		set format x xfmt
		set xlabel "date (UTC); one point per pack and minute " . \
		    "of charging"
	} else {
		set format x ""
		unset xlabel
	}
	plot in using (strcol("group") eq word(groups, i) ? \
	    timecolumn(2, fmt) : NaN):(column("temp_c")) \
	    with points pt 7 ps 0.3 lc rgb word(pal, i) notitle
}
unset multiplot
