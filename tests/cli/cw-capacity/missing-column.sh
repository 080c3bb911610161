# A stream without soc_pct or current_a is a data error (exit 1), named
# with its file and header line; without temp_c too, unless --temp any,
# which makes the temperature optional (and then the 25 Ah estimate by
# hand: 10 A for 36 s a row is 0.1 Ah, 0.4 points of 25 Ah; 60 rows from
# 90 to 66, steps from 89.6: 59 rows, 5.9 Ah over 23.6 points).
# source: hand
cd "$TMPDIR_CASE" || exit 2
printf 'device,time,current_a,temp_c\nA,0,1,25\n' >nosoc.csv
cw-capacity nosoc.csv
echo "rc=$?"
printf 'device,time,soc_pct,temp_c\nA,0,50,25\n' | cw-capacity -t
echo "rc=$?"
awk 'BEGIN { print "device,time,current_a,soc_pct"; print "A,0,0,90"
    for (k = 1; k <= 60; k++) printf "A,%d,-10,%.1f\n", 36 * k, 90 - 0.4 * k
    printf "A,%d,0,66\n", 36 * 60 + 600 }' >notemp.csv
cw-capacity notemp.csv
echo "rc=$?"
cw-capacity --temp any notemp.csv
echo "rc=$?"
