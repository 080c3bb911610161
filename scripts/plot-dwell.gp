# Where a group of packs spends its time: a heat map of hours per pack and
# day by SoC band and temperature band, with the share of them idle, from
# a CSV with the columns
#
#   soc_i,temp_i,soc_band,temp_band,hours_per_pack_day,idle_pct
#
# (soc_i and temp_i the band's position from 0, the bands as labels; a
# cell without time is left blank); scripts/demo.sh makes it for a group
# of packs from cw-wear --dwell and an asset register.  The labels and the
# numbers are read as data, never as gnuplot code.  For one pack over a
# log of DAYS days, with the default --limits (temperature edges 0, 10,
# 25, 35, 45):
#
#   cw-wear --dwell log.csv | awk -F, -v dev=EB-0001 -v days=2 '
#       BEGIN { n = split("0 10 25 35 45", e, " ")
#           for (k = 1; k <= n; k++) ti[e[k]] = k
#           print "soc_i,temp_i,soc_band,temp_band," \
#               "hours_per_pack_day,idle_pct" }
#       $1 == dev { t = $4 == "" ? "<" $5 : $5 == "" ? ">" $4 : $4 "-" $5
#           print ($2 == 95 ? 5 : $2 / 20) "," ($4 == "" ? 0 : ti[$4]) \
#               "," $2 "-" $3 "," t "," $6 / days "," 100 * $7 / $6 }' \
#       >dwell.csv
#   gnuplot -e "in='dwell.csv'; out='dwell.png'" scripts/plot-dwell.gp
#
# Optional: title='...', width=, height= (pixels).
if (!exists("in")) in = 'dwell.csv'
if (!exists("out")) out = 'dwell.png'
if (!exists("width")) width = 900
if (!exists("height")) height = 640
if (!exists("title")) title = 'Hours per pack and day by SoC and ' . \
    'temperature (cw-wear --dwell)'

set datafile separator ","
set datafile columnheaders
stats in using (column("hours_per_pack_day")) nooutput
hmax = STATS_max

set terminal pngcairo size width, height font "sans,11" noenhanced
set output out
set title title font "sans,13"
set xlabel "temperature band (C)"
set ylabel "SoC band (%)"
set cblabel "hours per pack and day"
set palette defined (0 "#ffffff", 1 "#fde0c5", 2 "#f59e72", 3 "#d55e00", \
    4 "#7f2704")
set cbrange [0:hmax > 0 ? hmax : 1]
set xrange [-0.5:5.5]
set yrange [-0.5:5.5]
set tics nomirror
set key off
set label 1 "in each cell: hours per pack and day, and % of them idle" \
    at graph 0.0, graph 1.03 font "sans,9"

plot in using (column("temp_i")):(column("soc_i")):(0.5):(0.5): \
	(column("hours_per_pack_day")):xtic(strcol("temp_band")): \
	ytic(strcol("soc_band")) with boxxyerror fs solid 1.0 \
	fc palette notitle, \
    '' using (column("temp_i")):(column("soc_i")): \
	(column("hours_per_pack_day") > 0 ? sprintf("%.2f h\n%.0f %% idle", \
	column("hours_per_pack_day"), column("idle_pct")) : "") \
	with labels font "sans,8" notitle
