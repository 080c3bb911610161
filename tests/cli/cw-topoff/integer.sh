# An integer-SoC gauge: a pack at 100 on a dock, a row every 60 s; the
# standby load (-0.15 A) shows as steps of whole percent, 100, 100, 100,
# 99, 99, 99, 99, 98, then the charger (0.6 A) takes it to 99 and 100 and
# rests; four times, then unplugged (-1.2 A).  Worked by hand: one hold
# from the first row to the last at 95 or more, four micro-cycles of depth
# 2 (100 - 98), each 2 rows * 0.6 A * 60 s = 0.02 Ah, 0.08 Ah in the hold.
# source: hand
f=$TMPDIR_CASE/i.csv
awk 'BEGIN {
	print "device,time,current_a,soc_pct"
	t = 1767225600
	printf "T7,%d,0,100\n", t
	for (c = 0; c < 4; c++) {
		split("100 100 99 99 99 99 98", lv, " ")
		for (k = 1; k <= 7; k++) { t += 60; printf "T7,%d,-0.15,%d\n", t, lv[k] }
		t += 60; printf "T7,%d,0.6,99\n", t
		t += 60; printf "T7,%d,0.6,100\n", t
		t += 60; printf "T7,%d,0,100\n", t
	}
	split("98 96 94 92", lv, " ")
	for (k = 1; k <= 4; k++) { t += 60; printf "T7,%d,-1.2,%d\n", t, lv[k] }
}' >"$f"
cw-topoff "$f"
cw-topoff -e "$f"
