# DC internal resistance at the reference temperature over time, one colour
# per pack, with the Theil-Sen trend line of each, from the two outputs of
# cw-dcir: the steps (default output) and the trend (-t), run with the
# same options.
#
#   cw-dcir -o steps.csv log.csv; cw-dcir -t -o trend.csv log.csv
#   gnuplot -e "steps='steps.csv'; trend='trend.csv'; \
#       packsfile='packs.txt'; out='dcir.png'" scripts/plot-dcir.gp
#
# PACKSFILE names the devices (up to 8), one a line, as they are (any
# byte but a tab or a line end): one panel each, two panels a row.  For
# names typed by hand, packs='EB-0014 EB-0004' (space-separated) does
# too; never paste data into a -e string, which gnuplot runs as code.
# The packs with the fastest growth are found with
#
#   awk -F, 'NR > 1 && $8 != "" { print $8 "\t" $1 }' trend.csv |
#       sort -t "$(printf '\t')" -k1,1rn | head -n 4 | cut -f 2 >packs.txt
#
# The trend line runs from r_start_ohm at the first step to r_end_ohm at
# the last, as cw-dcir -t reports them.  Optional: title='...', width=,
# height= (pixels).
if (!exists("steps")) steps = 'cw-dcir.csv'
if (!exists("trend")) trend = 'cw-dcir-trend.csv'
if (!exists("out")) out = 'dcir.png'
if (!exists("packs")) packs = ''
if (!exists("width")) width = 1200
if (!exists("title")) title = 'DC resistance at 25 °C per current step, ' . \
    'with Theil-Sen trend (cw-dcir)'
# The device names, read as data: from PACKSFILE, else the words of PACKS.
array names[8]
np = 0
if (exists("packsfile")) {
	set datafile separator "\t"
	set datafile nocolumnheaders
	set table $discard
	plot packsfile using (np < 8 && strlen(strcol(1)) > 0 ? \
	    (np = np + 1, names[np] = strcol(1), 0) : 0):(0) with table
	unset table
} else {
	do for [k = 1:(words(packs) < 8 ? words(packs) : 8)] {
		np = np + 1
		names[np] = word(packs, k)
	}
}
if (np == 0) {
	print "plot-dcir.gp: give packsfile='FILE' (a device a line) or packs='DEVICE ...'"
	exit status 2
}

set datafile separator ","
set datafile columnheaders
set datafile missing ""
fmt = "%Y-%m-%dT%H:%M:%SZ"
pal = "#0072b2 #d55e00 #009e73 #cc79a7 #e69f00 #56b4e9 #000000 #999999"
# Round times between ticks, in seconds: 1 h to 4 weeks.
steps_s = "3600 7200 10800 21600 43200 86400 172800 604800 1209600 2419200"
# Points half transparent (gnuplot's #AARRGGBB, AA the transparency).
dim(c) = "#a0" . c[2:7]

cols = np < 2 ? 1 : 2
rows = (np + cols - 1) / cols
if (!exists("height")) height = 300 * rows + 120

set terminal pngcairo size width, height font "sans,11" noenhanced
set output out
set grid lc rgb "#dddddd"
set xtics nomirror
set ytics nomirror
unset key
set xlabel "date (UTC)"
set ylabel "resistance at 25 °C (mΩ)"

# A steps file without data rows (no step passed the gates) gives one
# empty panel that says so; stats fails on such a file, so the rows are
# counted into a table (gnuplot warns of a file with no valid points).
set table $rows
plot steps using (1):(1) with table
unset table
if (|$rows| < 1) {
	set title sprintf("%s: no accepted steps", steps)
	set xrange [0:1]
	set yrange [0:1]
	unset xtics
	unset ytics
	set label 1 "no current step passed the gates of cw-dcir" \
	    at graph 0.5, graph 0.5 center
	plot NaN notitle
	exit
}
set xdata time
set timefmt fmt
set format x "%d %b"

set multiplot layout rows, cols title title font "sans,13"
do for [i = 1:np] {
	p = names[i]
	c = word(pal, i)
	# The pack's trend, its steps' spread and span (stats works on
	# plain numbers only, within the axis ranges in force).
	set xdata
	set autoscale xy
	# Sums of indicators keep every row a valid point for stats.
	has(f) = strcol("device") eq p && strcol(f) ne ""
	stats trend using (has("growth_pct_per_30d") ? 1 : 0) nooutput
	ng = STATS_sum
	stats trend using (has("growth_pct_per_30d") ? \
	    column("growth_pct_per_30d") : 0) nooutput
	g = ng > 0 ? sprintf("%+.1f %% per 30 days", STATS_sum / ng) : \
	    "no trend"
	stats steps using (has("r_ref_ohm") ? 1 : 0) nooutput
	nsteps = STATS_sum
	if (nsteps == 0) {
		set title sprintf("%s: no steps", p)
		set xdata time
		set autoscale xy
		plot NaN notitle
		continue
	}
	stats steps using (has("r_ref_ohm") ? 1000 * column("r_ref_ohm") : \
	    NaN) nooutput
	# The y range holds the middle of the spread (quartiles +- 2.5
	# interquartile ranges); the steps outside it are counted.
	iqr = STATS_up_quartile - STATS_lo_quartile
	ylo = STATS_lo_quartile - 2.5 * iqr
	yhi = STATS_up_quartile + 2.5 * iqr
	stats steps using (strcol("device") eq p ? \
	    (1000 * column("r_ref_ohm") < ylo || \
	    1000 * column("r_ref_ohm") > yhi) : NaN) nooutput
	nout = STATS_sum
	stats steps using (strcol("device") eq p ? timecolumn(2, fmt) : NaN) \
	    nooutput
	set xdata time
	span = STATS_max - STATS_min
	set xrange [STATS_min - 0.02 * span : STATS_max + 0.02 * span]
	set format x (span < 4 * 86400 ? "%d %b\n%H:%M" : "%d %b")
	inc = 0
	do for [k = 1:words(steps_s)] {
		if (inc == 0 && word(steps_s, k) + 0 >= span / 5) {
			inc = word(steps_s, k) + 0
		}
	}
	if (inc == 0) { inc = span / 5 }
	set xtics inc
	set yrange [ylo:yhi]
	set title sprintf("%s: %s (%d steps%s)", p, g, nsteps, \
	    nout > 0 ? sprintf(", %d outside the axis", nout) : "")
	plot steps using (strcol("device") eq p ? timecolumn(2, fmt) : NaN): \
	    (1000 * column("r_ref_ohm")) \
	    with points pt 7 ps 0.45 lc rgb dim(c), \
	    trend using (strcol("device") eq p && \
	    strcol("r_start_ohm") ne "" ? timecolumn(3, fmt) : NaN): \
	    (1000 * column("r_start_ohm")): \
	    (timecolumn(4, fmt) - timecolumn(3, fmt)): \
	    (1000 * (column("r_end_ohm") - column("r_start_ohm"))) \
	    with vectors nohead lw 3 lc rgb "#000000"
}
unset multiplot
