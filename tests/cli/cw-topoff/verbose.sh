# -v counts what was not judged: a SoC gauge that reports on every other
# row only (every other soc_pct empty), and a second device with no SoC
# at all.  Rows of A without SoC inside its hold keep the hold's level
# (3: at 60, 180, 300 s); the one at 420 s, after the hold ended at 94 %
# (360 s), is not judged; B's 3 rows are not judged (no --full-voltage).
# source: hand
f=$TMPDIR_CASE/s.csv
printf 'device,time,voltage_v,current_a,soc_pct\n' >"$f"
printf 'A,0,4.2,0,100\nA,60,4.2,0,\nA,120,4.2,0,99\nA,180,4.2,0,\n' >>"$f"
printf 'A,240,4.2,0,98\nA,300,4.2,0,\nA,360,4.1,-1,94\nA,420,4.1,-1,\n' >>"$f"
printf 'B,0,4.2,0,\nB,60,4.2,0,\nB,120,4.2,0,\n' >>"$f"
cw-topoff -v -s "$f"
echo "rc=$?"
