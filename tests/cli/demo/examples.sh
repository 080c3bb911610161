# Each usage example in the headers of scripts/plot-*.gp and
# scripts/morning-report.sh, as written there, on a small invented fleet
# without faults (4 packs, 2 days); the CSVs they make and the size of each
# plot (a PNG's IHDR width and height).
# source: snapshot: the CSVs and plot sizes of a small invented fleet, pinned
#   as the scripts make them
png() {
	od -An -tu1 -N24 "$1" | tr -s ' \n' '  ' | awk -v f="$1" '{
	    png = ($1 == 137 && $2 == 80 && $3 == 78 && $4 == 71)
	    w = (($17 * 256 + $18) * 256 + $19) * 256 + $20
	    h = (($21 * 256 + $22) * 256 + $23) * 256 + $24
	    print f ": " (png ? "PNG" : "not a PNG") ", " w " x " h }'
}
top=$PWD
cd "$TMPDIR_CASE" || exit 1
ln -s "$top/scripts" scripts
mkdir out
cw-synth -n 4 -d 2 -F none -o in || exit 1
cw-clean --charge-negative --cells 10 -o log.csv in/*.a.csv.gz || exit 1
cp log.csv stream.csv
awk -F, 'NR == 1 { print "device,site,group"; next }
    { print $1 "," $4 "," $2 }' in/truth-devices.csv >fleet.csv
cw-wear -o wear.csv log.csv || exit 1
cw-wear --cycle-life 500 -o out/cw-wear.csv log.csv || exit 1
cw-thermal -o out/cw-thermal.csv log.csv || exit 1

echo "== plot-fade.gp"
(head -n 1 wear.csv; tail -n +2 wear.csv | sort -t, -k18,18gr |
    head -n 40) >top.csv
cut -d, -f1,18 top.csv
gnuplot -e "in='wear.csv'; out='fade.png'" "scripts/plot-fade.gp"
png fade.png
gnuplot -e "in='top.csv'; out='top.png'" "scripts/plot-fade.gp"
png top.png

echo "== plot-dcir.gp"
cw-dcir -o steps.csv log.csv; cw-dcir -t -o trend.csv log.csv
awk -F, 'NR > 1 && $8 != "" { print $8, $1 }' trend.csv | sort -rn |
    head -n 4
gnuplot -e "steps='steps.csv'; trend='trend.csv'; \
    packs='EB-0001 EB-0004'; out='dcir.png'" "scripts/plot-dcir.gp"
png dcir.png
cw-dcir --temp -10,45 --soc 10,90 -o steps.csv log.csv
gnuplot -e "steps='steps.csv'; trend='trend.csv'; \
    packs='EB-0001 EB-0002 EB-0004'; out='dcir3.png'" "scripts/plot-dcir.gp"
png dcir3.png
gnuplot -e "steps='steps.csv'; trend='trend.csv'; out='none.png'" \
    "scripts/plot-dcir.gp"
echo "without packs: exit $?"

echo "== plot-rainflow.gp"
cw-rainflow --histogram 10 log.csv | awk -F, -v days=2 '
    NR == 1 { print "group,range_lo,range_hi,cycles_per_pack_day"; next }
    { print $1 "," $2 "," $3 "," $4 / days }' >groups.csv
cat groups.csv
gnuplot -e "in='groups.csv'; groups='EB-0001 EB-0002'; \
    out='rainflow.png'" "scripts/plot-rainflow.gp"
png rainflow.png

echo "== plot-charge-temp.gp"
awk -F, 'NR == FNR { g[$1] = $3; next }
    FNR == 1 { print "device,time,temp_c,group"; next }
    $4 > 0.05 && $5 != "" { print $1 "," $2 "," $5 "," g[$1] }' \
    fleet.csv stream.csv >charging.csv
head -n 3 charging.csv
wc -l <charging.csv
gnuplot -e "in='charging.csv'; out='charge-temp.png'" \
    "scripts/plot-charge-temp.gp"
png charge-temp.png

echo "== plot-dwell.gp"
cw-wear --dwell log.csv | awk -F, -v dev=EB-0001 -v days=2 '
    BEGIN { n = split("0 10 25 35 45", e, " ")
        for (k = 1; k <= n; k++) ti[e[k]] = k
        print "soc_i,temp_i,soc_band,temp_band," \
            "hours_per_pack_day,idle_pct" }
    $1 == dev { t = $4 == "" ? "<" $5 : $5 == "" ? ">" $4 : $4 "-" $5
        print ($2 == 95 ? 5 : $2 / 20) "," ($4 == "" ? 0 : ti[$4]) \
            "," $2 "-" $3 "," t "," $6 / days "," 100 * $7 / $6 }' \
    >dwell.csv
cat dwell.csv
gnuplot -e "in='dwell.csv'; out='dwell.png'" "scripts/plot-dwell.gp"
png dwell.png

echo "== morning-report.sh"
"scripts/morning-report.sh" -n 2 out fleet.csv
echo "exit $?"
