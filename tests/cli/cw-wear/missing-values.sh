# Rows without SoC or temperature are left out of the terms that need
# them and counted with -v; a row whose SoC is "x" is counted as not a
# number.  Device B never has a temperature: its model fields are empty.
cat >"$TMPDIR_CASE/in.csv" <<'CSV'
device,time,current_a,temp_c,soc_pct
A,2026-03-01T00:00:00Z,1,25,50
A,2026-03-01T00:01:00Z,1,,51
A,2026-03-01T00:02:00Z,1,25,
A,2026-03-01T00:03:00Z,1,25,x
A,2026-03-01T00:04:00Z,1,25,53
B,2026-03-01T00:00:00Z,-1,,80
B,2026-03-01T00:01:00Z,-1,,79
CSV
cw-wear -v "$TMPDIR_CASE/in.csv"
