# --ocv: the SoC from the rested voltage.  By hand: a 10-cell pack of
# 20 Ah on the table below (3.0 V at 0 %, 4.0 V at 100 %, linear), rested
# 40 minutes at 39.0 V (3.90 V a cell: 90 %), discharged at 10 A for an
# hour (10 Ah), rested 40 minutes at 34.0 V (40 %): 10 Ah over 50 points,
# 20 Ah.  The rest of 20 minutes at 37.0 V that follows a short charge is
# not an OCV point (shorter than --ocv-rest 30m); --ocv-rest 15m makes it
# one (70 %, 6 Ah over 30 points: 20 Ah again).  The rows need no
# soc_pct.  Then the table's errors: FILE:LINE, exit 1.
# source: hand
cd "$TMPDIR_CASE" || exit 2
printf 'voltage_v,soc_pct\n3.0,0\n4.0,100\n' >ocv.csv
awk 'BEGIN { print "device,time,voltage_v,current_a,temp_c"; t = 0
    for (k = 0; k <= 4; k++) { printf "P,%d,39.0,0,25\n", t; t += 600 }
    for (k = 0; k < 6; k++) { printf "P,%d,37.5,-10,25\n", t; t += 600 }
    for (k = 0; k <= 4; k++) { printf "P,%d,34.0,0,25\n", t; t += 600 }
    for (k = 0; k < 6; k++) { printf "P,%d,36.0,6,25\n", t; t += 600 }
    for (k = 0; k <= 1; k++) { printf "P,%d,37.0,0,25\n", t; t += 600 }
    printf "P,%d,36.0,-1,25\n", t }' >log.csv
cw-capacity --ocv ocv.csv --cells 10 log.csv
echo "rc=$?"
cw-capacity --ocv ocv.csv --cells 10 --ocv-rest 15m log.csv | cut -d, -f1-8
printf 'soc_pct,voltage_v\n0,3.0\n50,3.7\n40,3.8\n' >down.csv
cw-capacity --ocv down.csv log.csv
echo "rc=$?"
printf 'soc_pct,voltage_v\n0,3.0\n50,x\n' >nan.csv
cw-capacity --ocv nan.csv log.csv
echo "rc=$?"
printf 'soc,voltage_v\n0,3.0\n' >nocol.csv
cw-capacity --ocv nocol.csv log.csv
echo "rc=$?"
printf 'soc_pct,voltage_v\n0,3.0\n' >one.csv
cw-capacity --ocv one.csv log.csv
echo "rc=$?"
for o in "--cells 0" "--ocv-rest 0" "--ocv-span x"; do
	# shellcheck disable=SC2086
	cw-capacity --ocv ocv.csv $o log.csv
	echo "$o: rc=$?"
done
