# --max-gap: nothing is interpolated across a longer interval; the grid
# starts again at the first grid point at or after the row that ends the
# gap.  Default 15m.
# source: hand (cw-clean(1) Resampling and Gaps).  Default 15m, by hand:
#  00:00:00  the first row's values.
#  00:01:00  V = 3.70 + 0.02 * 60/90 = 3.713333333, T = 20 + 60/90; I = 60 s
#            of the 2 A row 00:01:30 / 60 = 2.
#  00:02:00  V = 3.72 + 0.08 * 30/510 = 3.724705882 (00:01:30..00:10:00,
#            510 s), T = 21 + 30/510 = 21.05882353; I = 30 s at 2 A and
#            30 s at 1 A = 1.5.  00:03..00:09 likewise, I = 1.
#  00:10:00  on a row: its values; the run ends there (the next row is 20
#            min on, past 15m).  00:30:00 on the row that starts the next
#            run: its values.
#  00:31:00  V = 3.91 + 0.01 * 20/40 = 3.915, I = 0.5.
#  00:32:00  frames the run after its last row (00:31:20): that row's V and
#            T, I = 20 s at 0.5 A / 60 = 0.1666666667.
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
