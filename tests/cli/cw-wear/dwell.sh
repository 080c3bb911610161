# --dwell: hours by SoC band and temperature band, derived by hand.
#   A  90 -> 100 % SoC and 20 -> 30 C in 10 min, charging at 1 A: both
#      cross an edge (95 %, 25 C) half way, so 1/12 h in 80-95 % x
#      10-25 C and 1/12 h in 95-100 % x 25-35 C, none idle; then 10 min
#      at 100 %, 30 C, resting: 1/6 h there, idle.
#   B  at rest at 50 %, 40 C for 1 h: 1 h in 40-60 % x 35-45 C, idle;
#      a row without SoC in the middle is passed over (the interval runs
#      between the rows that know both); then a 2 h gap (over the 15 min
#      --max-gap) holds the row before it: 2 h more there, idle; then
#      10 min (1/6 h) from 50 to 10 % and 40 to -5 C, discharging at 2 A,
#      cut at 40 and 20 % (u = 1/4, 3/4) and 35, 25, 10 and 0 C (u = 1/9,
#      1/3, 2/3, 8/9): 40-60 % x 35-45 C 1/54 h (3.0185185 with the 3 h),
#      40-60 x 25-35 5/216 (0.0231481), 20-40 x 25-35 1/72 (0.0138889),
#      20-40 x 10-25 1/18 (0.0555556), 20-40 x 0-10 1/72, 0-20 x 0-10
#      5/216, 0-20 x below 0 1/54 (0.0185185), none idle.
#   C  no temperature: no rows.
# Then the same with --limits 5,10,45,60 (edges 5, 10, 25, 35, 45: 0-10
# C becomes below 5 C, u = 7/9, and 5-10 C) and --min-current 3 (every
# row then idle), the 95-100 % hours against hours_near_full of the
# plain report (the same interpolation), and --dwell with --state (a
# usage error).
# source: hand
cat >"$TMPDIR_CASE/in.csv" <<'CSV'
device,time,current_a,temp_c,soc_pct
A,2026-03-01T00:00:00Z,1,20,90
A,2026-03-01T00:10:00Z,1,30,100
A,2026-03-01T00:20:00Z,0,30,100
B,2026-03-01T00:00:00Z,0,40,50
B,2026-03-01T00:30:00Z,0,40,
B,2026-03-01T01:00:00Z,0,40,50
B,2026-03-01T03:00:00Z,0,40,50
B,2026-03-01T03:10:00Z,-2,-5,10
C,2026-03-01T00:00:00Z,1,,50
C,2026-03-01T00:10:00Z,1,,60
CSV
cw-wear --dwell "$TMPDIR_CASE/in.csv"
echo "rc $?"
cw-wear --dwell --limits 5,10,45,60 --min-current 3 "$TMPDIR_CASE/in.csv"
cw-wear --dwell "$TMPDIR_CASE/in.csv" | awk -F, '$2 == 95 { h[$1] += $6 }
    END { for (d in h) print d, h[d] }' >"$TMPDIR_CASE/a"
cw-wear "$TMPDIR_CASE/in.csv" | awk -F, 'NR > 1 && $8 > 0 { print $1, $8 }' |
    cmp - "$TMPDIR_CASE/a" && echo "95-100 % hours = hours_near_full"
cw-wear --dwell --state "$TMPDIR_CASE/s" "$TMPDIR_CASE/in.csv"
echo "rc $?"
