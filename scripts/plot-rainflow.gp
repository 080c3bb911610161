# Rainflow cycle depth histogram per group of packs, bars side by side,
# from a CSV with the columns group,range_lo,range_hi,cycles_per_pack_day
# (any bin width; scripts/demo.sh makes it from cw-rainflow's cycles and
# an asset register).  Per device instead, from cw-rainflow --histogram,
# over a log of DAYS days:
#
#   cw-rainflow --histogram 10 log.csv | awk -F, -v days=2 '
#       NR == 1 { print "group,range_lo,range_hi,cycles_per_pack_day"; next }
#       { print $1 "," $2 "," $3 "," $4 / days }' >groups.csv
#   gnuplot -e "in='groups.csv'; groups='EB-0001 EB-0002'; \
#       out='rainflow.png'" scripts/plot-rainflow.gp
#
# GROUPS lists the groups to draw, in order (up to 6; names without
# spaces).  The y axis is logarithmic: shallow cycles outnumber deep ones
# by orders of magnitude.  Optional: title='...', ylabel='...', width=,
# height= (pixels).
if (!exists("in")) in = 'rainflow-groups.csv'
if (!exists("out")) out = 'rainflow.png'
if (!exists("groups")) groups = 'deep-depot topup-dock idle-dock topup-nocutoff'
if (!exists("width")) width = 1200
if (!exists("height")) height = 640
if (!exists("title")) title = 'Rainflow cycle depths per group of packs ' . \
    '(ASTM E1049-85, cw-rainflow)'
if (!exists("ylabel")) ylabel = 'cycles per pack and day'

set datafile separator ","
set datafile columnheaders
pal = "#e69f00 #56b4e9 #009e73 #0072b2 #d55e00 #cc79a7"
n = words(groups)

stats in using (column("range_hi")) nooutput
xmax = STATS_max
stats in using (column("cycles_per_pack_day")) nooutput
ymax = STATS_max
ymin = STATS_min

set terminal pngcairo size width, height font "sans,11" noenhanced
set output out
set title title font "sans,13"
set xlabel "cycle depth: rainflow range of SoC (%), each bar the cycles " . \
    "with lo < depth ≤ hi"
set ylabel ylabel
set logscale y
set yrange [10 ** floor(log10(ymin)) : 10 ** ceil(log10(ymax) + 0.3)]
set xrange [0:xmax]
set xtics 10 nomirror
set mxtics 1
set ytics nomirror
set grid ytics lc rgb "#dddddd"
set style fill solid 0.9 border lc rgb "#555555"
set key top right box title "group" samplen 1.5 width 1

# Bar i of a bin of width w starts i - 1 bar widths from its left edge,
# with half a bar of space at each side of the bin.
bw(lo, hi) = (hi - lo) / (n + 1.0)
plot for [i = 1:n] in \
	using (strcol("group") eq word(groups, i) ? \
	column("range_lo") + bw(column("range_lo"), column("range_hi")) * i : \
	NaN):(column("cycles_per_pack_day")): \
	(bw(column("range_lo"), column("range_hi"))) \
	with boxes lc rgb word(pal, i) title word(groups, i)
