# scripts/morning-report.sh raises the resistance reason only on a sure
# growth: the lower end of cw-dcir's interval, growth_lo_pct_per_30d, at
# 5 % per 30 days or more.  Hand-made inputs, three packs of equal wear
# (days_to_eol 900, 800 and 700, dominant cycling, no cold charge):
#   EB-1  growth 8 %, interval 6 to 10: sure, rank 2 (first);
#   EB-2  growth 9 %, interval -1 to 19: not sure, rank 3;
#   EB-3  growth 7 %, no lower end (an older cw-dcir): not sure, rank 3.
# So EB-1 comes first though its days_to_eol is the longest, then EB-3
# (700 days) and EB-2 (800).  Every pack's resistance line is printed.
# source: hand
d=$TMPDIR_CASE
cat >"$d/cw-wear.csv" <<'CSV'
device,first,last,days,charge_ah,cold_charge_ah,fade_pct,soh_pct,days_to_eol,dominant
EB-1,2026-03-01T00:00:00Z,2026-03-31T00:00:00Z,30,100,0,1,99,900,cycling
EB-2,2026-03-01T00:00:00Z,2026-03-31T00:00:00Z,30,100,0,1,99,800,cycling
EB-3,2026-03-01T00:00:00Z,2026-03-31T00:00:00Z,30,100,0,1,99,700,cycling
CSV
printf 'device,kind,zone,start,end,duration_s,charge_ah\n' >"$d/cw-thermal.csv"
cat >"$d/cw-dcir-trend.csv" <<'CSV'
device,growth_pct_per_30d,eol_date,growth_lo_pct_per_30d
EB-1,8,2026-09-01,6
EB-2,9,,-1
EB-3,7,,
CSV
scripts/morning-report.sh -n 3 "$d"
echo "exit $?"
