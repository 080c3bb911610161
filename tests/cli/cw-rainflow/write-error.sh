# A write error (a full disk: /dev/full) is a data error, exit 1, with a
# message: at the end of the input, and in the middle of it (20000 rows
# of 0/100 close about 10000 cycles, more than the writer's buffer).
# source: spec
cw-rainflow -s testdata/rainflow-fleet.csv >/dev/full
echo "rc=$?"
awk 'BEGIN { print "device,time,soc_pct"
    for (i = 0; i < 20000; i++) print "A," 1772431200 + 60 * i "," (i % 2) * 100 }' |
    cw-rainflow >/dev/full
echo "rc=$?"
