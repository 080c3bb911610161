# --step: a grid of the multiples of the step since the epoch.  Worked by
# hand from the definitions in cw-clean(1):
#  00:01:00  V between 00:00:50 (3.72) and 00:01:10 (3.75), halfway: 3.735;
#            T likewise 21.5.  I = mean over (00:00:07, 00:01:00], the part
#            the rows cover: 43 s at 2 A (row 00:00:50) and 10 s at 3 A
#            (row 00:01:10): 116/53 = 2.188679245 A.
#  00:02:00  V = 3.75 + (3.80 - 3.75) * 50/115 = 3.77173913;
#            I over (00:01:00, 00:02:00]: 10 s at 3 A, 50 s at 1 A = 80/60.
#  00:03:00  I = 1 (row 00:03:05 covers it all).
#  00:04:00  exactly on a row: its V, T and SoC (54, though 00:03:05 has
#            no SoC); I over (00:03:00, 00:04:00]: 5 s at 1 A, 55 s at
#            0.5 A = 32.5/60 = 0.5416666667.
#  00:05:00  I over (00:04:00, 00:05:00]: 30 s at 4 A, 30 s at -2 A = 1;
#            V, T and SoC from 00:04:30 and 00:05:30, halfway; SoC empty
#            where a neighbour has none.
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
echo '== bad steps'
cw-clean --step 0 a.csv
echo "rc=$?"
cw-clean --step 1w a.csv
