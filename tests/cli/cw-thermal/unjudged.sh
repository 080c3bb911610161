# Rows without temperature (or current) cannot be judged: counted and
# reported with -v, part of no event.  A one-row dropout inside a cold
# charge splits the run and --merge (2m) joins it again.  A stream
# without a temp_c column is a data error (exit 1).
# source: hand (1 A for 60 s is 1/60 Ah a row.  The cool event holds the rows
#   at 60, 120 and 180 s, 0.05 Ah: the dropout at 120 s splits the run and
#   --merge joins it with the charge between.  Summary: 5 rows with a current,
#   1/60 Ah each: 2 cool (60, 180), 1 normal (360), 2 without a temperature
#   (120, 240); 3 unjudged (120, 240, 300))
f=$TMPDIR_CASE/u.csv
cat >"$f" <<'ROWS'
device,time,current_a,temp_c,soc_pct
U,0,1,5,10
U,60,1,5,11
U,120,1,,12
U,180,1,5,13
U,240,1,abc,14
U,300,,5,15
U,360,1,20,15
ROWS
cw-thermal -v "$f"
cw-thermal -s "$f" | cut -d, -f1,4,6,7,10,20
printf 'device,time,current_a\nU,0,1\n' | cw-thermal
echo "rc=$?"
