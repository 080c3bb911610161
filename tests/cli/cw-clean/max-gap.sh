# --max-gap: nothing is interpolated across a longer interval; the grid
# starts again at the first grid point at or after the row that ends the
# gap.  Default 15m.
cd "$TMPDIR_CASE" || exit 1
cat >a.csv <<'CSV'
device,time,voltage_v,current_a,temp_c
B,2026-03-01T00:00:00Z,3.70,1.0,20
B,2026-03-01T00:01:30Z,3.72,2.0,21
B,2026-03-01T00:10:00Z,3.80,1.0,22
B,2026-03-01T00:30:00Z,3.90,0.5,24
B,2026-03-01T00:30:40Z,3.91,0.5,24
B,2026-03-01T00:31:20Z,3.92,0.5,24
CSV
echo '== default 15m: 00:01:30..00:10:00 (8.5 min) is bridged, 00:10..00:30 is not'
cw-clean --step 1m a.csv
echo '== --max-gap 5m: 00:01:30..00:10:00 is a gap too'
cw-clean --step 1m --max-gap 5m a.csv
echo '== --max-gap 90s: an interval of exactly 90 s is no gap'
cw-clean --step 1m --max-gap 90s a.csv | sed -n '1,3p'
echo '== without --step, rows pass at their own times whatever the gaps'
cw-clean --max-gap 1s a.csv
cw-clean --max-gap x a.csv
