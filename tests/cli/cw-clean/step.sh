# --step: a grid of the multiples of the step since the epoch.
# source: hand (from the definitions of Resampling in cw-clean(1) and
# charge.h: a row's current holds over (previous row, row]; a grid point's
# current is the charge of the rows over (g - step, g] divided by the step,
# the mean current only where the rows cover the whole interval).
# Worked by hand, 60 s grid:
#  00:00:00  the grid point at or before the first row (00:00:07) frames
#            the run: that row's values, its current 1 included.
#  00:01:00  V between 00:00:50 (3.72) and 00:01:10 (3.75), halfway: 3.735;
#            T 21.5, SoC 51.5 likewise.  Charge over (00:00:00, 00:01:00]:
#            the first row's current stands for the interval before it,
#            which the log does not hold (no charge); 43 s at 2 A (row
#            00:00:50) and 10 s at 3 A (row 00:01:10): 116 As / 60 s =
#            1.933333333 A.  (Not 116/53 = 2.188679245, the mean over the
#            53 s the rows cover: that grid row would carry 131.3 As, more
#            than the log's 116.  An earlier version of this comment gave
#            116/53, the rule before commit ab8986c framed runs.)
#  00:02:00  V = 3.75 + (3.80 - 3.75) * 50/115 = 3.77173913, T = 22 +
#            50/115 = 22.43478261, SoC empty (00:03:05 has none);
#            I over (00:01:00, 00:02:00]: 10 s at 3 A, 50 s at 1 A = 80/60.
#  00:03:00  V = 3.75 + 0.05 * 110/115 = 3.797826087; I = 1 (row 00:03:05
#            covers it all).
#  00:04:00  exactly on a row: its V, T and SoC (54, though 00:03:05 has
#            no SoC); I over (00:03:00, 00:04:00]: 5 s at 1 A, 55 s at
#            0.5 A = 32.5/60 = 0.5416666667.
#  00:05:00  I over (00:04:00, 00:05:00]: 30 s at 4 A, 30 s at -2 A = 1;
#            V, T and SoC from 00:04:30 and 00:05:30, halfway.
#  00:06:00  the grid point at or after the last row (00:05:30) frames the
#            run: that row's V, T, SoC; I = 30 s at -2 A / 60 s = -1.
# 2 min grid: 00:02:00 I = (43 * 2 + 20 * 3 + 50 * 1) / 120 = 196/120 =
# 1.633333333; 00:04:00 (65 * 1 + 55 * 0.5) / 120 = 0.7708333333;
# 00:06:00 (30 * 4 + 60 * -2) / 120 = 0.
# 30 s grid: 00:00:30 V = 3.70 + 0.02 * 23/43 = 3.710697674, I = 23 s at
# 2 A / 30 = 1.533333333; 00:01:00 I = (20 * 2 + 10 * 3) / 30 = 2.333333333.
# Charge: the log's rows after the first carry 43*2 + 20*3 + 115*1 +
# 55*0.5 + 30*4 + 60*(-2) = 288.5 As; each grid computes its own below.
cd "$TMPDIR_CASE" || exit 1
cat >a.csv <<'CSV'
device,time,voltage_v,current_a,temp_c,soc_pct
B,2026-03-01T00:00:07Z,3.70,1.0,20,50
B,2026-03-01T00:00:50Z,3.72,2.0,21,51
B,2026-03-01T00:01:10Z,3.75,3.0,22,52
B,2026-03-01T00:03:05Z,3.80,1.0,23,
B,2026-03-01T00:04:00Z,3.81,0.5,23.5,54
B,2026-03-01T00:04:30Z,3.82,4.0,24,55
B,2026-03-01T00:05:30Z,3.84,-2.0,25,56
CSV
cw-clean --step 60 a.csv
echo '== 1m is the same grid as 60'
cw-clean --step 60 a.csv >s60.csv
cw-clean --step 1m a.csv | cmp - s60.csv && echo same
echo '== a 2 minute grid: 00:02, 00:04 (the row itself)'
cw-clean -v --step 2m a.csv
echo '== a fractional step: 0.5m is 30 s'
cw-clean --step 0.5m a.csv | sed -n '1,4p'
echo '== charge in As, the rows after the first, as charge.h integrates'
# Each row's current times the time since the row before it.
charge() {
	awk -F, 'NR > 2 { split($2, a, /[T:Z]/); t = a[2] * 3600 + a[3] * 60 + a[4]
	    q += $4 * (t - p) } NR > 1 { split($2, a, /[T:Z]/)
	    p = a[2] * 3600 + a[3] * 60 + a[4] } END { printf "%.6g\n", q }'
}
charge <a.csv
for s in 60 2m 0.5m; do cw-clean --step $s a.csv | charge; done
echo '== bad steps'
cw-clean --step 0 a.csv
echo "rc=$?"
cw-clean --step 1w a.csv
