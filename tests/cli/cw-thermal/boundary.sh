# Each zone and each threshold exactly (JEITA zone scheme, defaults
# T1..T4 = 0, 10, 45, 60 C; which zone owns a value exactly at a
# threshold is cw-thermal's documented rule: the one nearer normal).
# Every device charges 1 A at one temperature for 3 rows 60 s apart:
# 2 intervals * 60 s * 1 A = 120 As = 0.03333333333 Ah, all in one zone.
# source: hand
f=$TMPDIR_CASE/b.csv
echo device,time,current_a,temp_c >"$f"
for t in -5 -0.001 0 5 9.999 10 25 45 45.001 60 60.001 75; do
	for s in 0 60 120; do echo "T$t,$s,1,$t"; done
done >>"$f"
cw-thermal -s "$f" | cut -d, -f1,4-10
echo
cw-thermal "$f" | cut -d, -f1-3,6
