# --signal COLUMN: any numeric column, a stream column or another one.
# efc is only for soc_pct (empty otherwise).  cell_mv: 3500, 4100, 3600
# -> halves of 600 and 500 with the default hysteresis of 1 (mV here).
# source: hand
f=$TMPDIR_CASE/s.csv
cat >"$f" <<'CSV'
device,time,voltage_v,cell_mv,soc_pct
A,2026-01-01T00:00:00Z,35.0,3500,20
A,2026-01-01T01:00:00Z,41.0,4100,95
A,2026-01-01T02:00:00Z,36.0,3600,30
CSV
cw-rainflow --signal cell_mv "$f"
cw-rainflow --signal cell_mv -s "$f"
cw-rainflow --signal voltage_v --hysteresis 0.5 -s "$f"
cw-rainflow -s "$f"
