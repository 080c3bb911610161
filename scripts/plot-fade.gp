# Modelled capacity fade per pack, coloured by its dominant stressor, from
# the output of cw-wear (columns found by name, in any order).
#
#   gnuplot -e "in='wear.csv'; out='fade.png'" scripts/plot-fade.gp
#
# One bar per row of IN, in its order, labelled with the years to 80 %
# state of health at the pace of the span (days_to_eol / 365.25).  For a
# large fleet plot the packs that matter, for example the 40 with the most
# fade:
#
#   (head -n 1 wear.csv; tail -n +2 wear.csv | sort -t, -k18,18gr |
#       head -n 40) >top.csv
#
# Optional: title='...', width=, height= (pixels).
if (!exists("in")) in = 'cw-wear.csv'
if (!exists("out")) out = 'fade.png'
if (!exists("width")) width = 1200
if (!exists("height")) height = 640
if (!exists("title")) title = 'Modelled capacity fade per pack ' . \
    '(Xu et al. 2018 model, cw-wear)'

set datafile separator ","
set datafile columnheaders
set datafile missing ""
# The dominant stressors cw-wear names, and a colour for each (the
# colour-blind-safe palette of Okabe and Ito).
doms = "cold-charge heat high-soc cycling none"
cols = "#0072b2 #d55e00 #cc79a7 #e69f00 #999999"
colour(s) = s eq "cold-charge" ? 0x0072b2 : s eq "heat" ? 0xd55e00 : \
    s eq "high-soc" ? 0xcc79a7 : s eq "cycling" ? 0xe69f00 : 0x999999

# How many rows name each stressor, so the key lists only those present.
array seen[5]
do for [i = 1:5] {
	stats in using (strcol("dominant") eq word(doms, i) ? 1 : 0) \
	    nooutput
	seen[i] = STATS_sum
}
stats in using (column("fade_pct")) nooutput
ymax = STATS_max
nrow = STATS_records + STATS_invalid

set terminal pngcairo size width, height font "sans,11" noenhanced
set output out
set title title font "sans,13"
set ylabel "capacity fade over the logged span (points of rated)"
set xlabel "pack"
set xtics rotate by 60 right nomirror font "sans,9"
set ytics nomirror
set grid ytics lc rgb "#dddddd"
set yrange [0:ymax * 1.25]
set xrange [-0.7:nrow - 0.3]
set style fill solid 0.9 border lc rgb "#555555"
set boxwidth 0.75
set key top left Left reverse box opaque title "dominant stressor" \
    samplen 1.5
set label 1 "label: years to 80 % SoH at this pace (none told for " . \
    "cold-charge)" at graph 0.99, graph 0.96 right font "sans,9"

plot in using 0:(column("fade_pct")):(colour(strcol("dominant"))): \
	xtic(strcol("device")) with boxes lc rgb variable notitle, \
    '' using 0:(column("fade_pct")): \
	(strcol("days_to_eol") eq "" ? "" : \
	sprintf("%.1f", column("days_to_eol") / 365.25)) \
	with labels offset 0, 0.7 font "sans,8" notitle, \
    for [i = 1:5] NaN with boxes lc rgb word(cols, i) \
	title (seen[i] > 0 ? word(doms, i) : "")
