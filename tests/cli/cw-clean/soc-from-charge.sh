# --soc-from-charge AH with --full-voltage: SoC by coulomb counting from a
# full-charge detection (V >= full voltage and |I| < C/20), re-anchored at
# every later one.  A 2 Ah pack: C/20 = 0.1 A.  Worked by hand:
#   00:01  4.16 V but 0.2 A >= 0.1 A: not full, SoC unknown (empty).
#   00:26  4.20 V, 0.05 A: full, 100.
#   00:32  6 min at -2 A = -0.2 Ah = -10 % of 2 Ah: 90.
#   00:38  6 min at -1 A: -5 %: 85.
#   00:44  4.18 V, -0.09 A: full again, 100 (not 85 - 0.45).
#   00:50  6 min at -1 A from 100: 95.
# source: hand
cd "$TMPDIR_CASE" || exit 1
cat >a.csv <<'CSV'
device,time,voltage_v,current_a,temp_c,soc_pct
C,2026-03-01T00:00:00Z,3.90,0.5,20,33
C,2026-03-01T00:01:00Z,4.16,0.2,20,33
C,2026-03-01T00:02:00Z,4.10,-1.0,20,33
C,2026-03-01T00:26:00Z,4.20,0.05,20,33
C,2026-03-01T00:32:00Z,4.00,-2.0,20,33
C,2026-03-01T00:38:00Z,3.95,-1.0,20,33
C,2026-03-01T00:44:00Z,4.18,-0.09,20,33
C,2026-03-01T00:50:00Z,4.10,-1.0,20,33
CSV
echo '== default full voltage 4.15 V; the SoC column of the log is replaced'
cw-clean --soc-from-charge 2 a.csv
echo '== --full-voltage 4.19: only 00:26 is full'
cw-clean --soc-from-charge 2 --full-voltage 4.19 a.csv | cut -d, -f2,6
echo '== --max-gap 5m: the 6 min intervals lose the count until the next full charge'
cw-clean --soc-from-charge 2 --max-gap 5m a.csv | cut -d, -f2,6
echo '== --cells 2: the default full voltage is 8.3 V, nothing here is full'
sed 's/,4\./,8./; s/,3\./,7./' a.csv >b.csv
cw-clean --cells 2 --soc-from-charge 2 b.csv | cut -d, -f2,3,6
echo '== with --step the counted SoC is interpolated like any SoC'
cw-clean --soc-from-charge 2 --step 3m a.csv | cut -d, -f2,6 | sed -n '1p;/00:2[7-9]\|00:3[0-9]/p'
echo '== usage errors'
cw-clean --soc-from-charge 0 a.csv
echo "rc=$?"
cw-clean --soc-from-charge 2 --full-voltage 4,2 a.csv
