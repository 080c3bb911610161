# Modelled against measured capacity fade per pack, from the output of
# cw-wear --measured (columns found by name, in any order): one point per
# pack with a measured fade, at (measured_fade_pct, fade_pct), coloured
# by its dominant stressor and labelled with its device name (read as
# data, never as gnuplot code), with the line where the two agree.  Points
# above the line: the model ages the pack faster than its measured
# capacity says (model_error_pct > 0).
#
#   gnuplot -e "in='wear.csv'; out='measured.png'" scripts/plot-measured.gp
#
# gnuplot reads a quoted name with a comma whole, but not RFC 4180's
# doubled quote inside one: such a label is cut at it (the point stands).
#
# Optional: title='...', width=, height= (pixels).
if (!exists("in")) in = 'cw-wear.csv'
if (!exists("out")) out = 'measured.png'
if (!exists("width")) width = 900
if (!exists("height")) height = 800
if (!exists("title")) title = 'Modelled against measured capacity ' . \
    'fade (cw-wear --measured)'

set datafile separator ","
set datafile columnheaders
set datafile missing ""
doms = "cold-charge heat high-soc cycling none"
cols = "#0072b2 #d55e00 #cc79a7 #e69f00 #999999"
colour(s) = s eq "cold-charge" ? 0x0072b2 : s eq "heat" ? 0xd55e00 : \
    s eq "high-soc" ? 0xcc79a7 : s eq "cycling" ? 0xe69f00 : 0x999999

# Only packs with a measured fade count (the column is empty otherwise).
array seen[5]
do for [i = 1:5] {
	stats in using ((strcol("dominant") eq word(doms, i) && \
	    strcol("measured_fade_pct") ne "") ? 1 : 0) nooutput
	seen[i] = STATS_sum
}
stats in using (strcol("measured_fade_pct") ne "" && \
    strcol("fade_pct") ne "" ? 1 : 0) nooutput
npts = int(STATS_sum)
top = 1
bot = 0
# With no point at all (a span too short for any trend) the frame is
# drawn empty, with the count saying so.
if (npts > 0) {
	stats in using (column("measured_fade_pct")):(column("fade_pct")) \
	    nooutput
	top = (STATS_max_x > STATS_max_y ? STATS_max_x : STATS_max_y) * 1.15
	bot = STATS_min_x < STATS_min_y ? STATS_min_x : STATS_min_y
	bot = bot < 0 ? bot * 1.15 : 0
	top = top > bot ? top : bot + 1
}

set terminal pngcairo size width, height font "sans,11" noenhanced
set output out
set title title font "sans,13"
set xlabel "measured fade over the span (points of rated, cw-capacity --trend)"
set ylabel "modelled fade over the span (points of rated, cw-wear)"
set grid lc rgb "#dddddd"
set xrange [bot:top]
set yrange [bot:top]
set size ratio -1
set key top left Left reverse box opaque title "dominant stressor" \
    samplen 1.5
set label 1 sprintf("%d packs with a sure measured fade", npts) \
    at graph 0.99, graph 0.03 right font "sans,9"

plot x with lines dt 2 lc rgb "#555555" title "model = measurement", \
    in using (column("measured_fade_pct")):(column("fade_pct")): \
	(colour(strcol("dominant"))) with points pt 7 ps 1.4 \
	lc rgb variable notitle, \
    '' using (column("measured_fade_pct")):(column("fade_pct")): \
	(strcol("device")) with labels left offset 0.8, 0 font "sans,8" \
	notitle, \
    for [i = 1:5] NaN with points pt 7 ps 1.4 lc rgb word(cols, i) \
	title (seen[i] > 0 ? word(doms, i) : "")
